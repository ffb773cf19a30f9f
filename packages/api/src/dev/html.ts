/** Minimal server-rendered pages for the local fakes (development only). */
export function escapeHtml(value: string): string {
  return value.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );
}

export function page(title: string, body: string): string {
  return `<!doctype html><html lang="en-GB"><head><meta charset="utf-8"><title>${escapeHtml(title)} · Cairn local fakes</title>
<meta name="viewport" content="width=device-width, initial-scale=1">
<style>
 body{font-family:system-ui,sans-serif;margin:0;background:#f7f5f0;color:#1c2127}
 header{background:#12303a;color:#f4efe4;padding:12px 24px;font-weight:700}
 header small{font-weight:400;color:#c9b48f;margin-left:8px}
 main{max-width:980px;margin:0 auto;padding:20px 24px}
 table{border-collapse:collapse;width:100%;background:#fff}
 th,td{border-bottom:1px solid #d8d2c4;padding:6px 8px;text-align:left;font-size:14px}
 iframe{width:100%;height:70vh;border:1px solid #d8d2c4;background:#fff}
 .empty{color:#5f6b7c} dt{font-weight:700} dd{margin:0 0 6px}
</style></head><body><header>Cairn <small>local development fakes — not part of a real deployment</small></header>
<main><h1>${escapeHtml(title)}</h1>${body}</main></body></html>`;
}
