/** The fake identity provider's pages: persona picker, auto-post to Cairn, errors. */
import { escapeHtml, page } from '../html.js';
import type { Persona } from './personas.js';

const roleLabels: Record<Persona['role'], string> = {
  regional_lead: 'Regional lead',
  practice_lead: 'Practice lead',
  auditor: 'Auditor',
};

const styles = `<style>
 .intro{max-width:46em;line-height:1.5}
 .personas{display:grid;grid-template-columns:repeat(auto-fill,minmax(280px,1fr));gap:14px;margin:18px 0}
 .persona{background:#fff;border:1px solid #d8d2c4;border-top:3px solid #c9b48f;border-radius:6px;padding:14px 16px;display:flex;flex-direction:column;gap:6px}
 .persona.refused{border-top-color:#d55e00}
 .persona h2{font-size:17px;margin:0}
 .persona .email{font-size:13px;color:#5f6b7c;word-break:break-all}
 .persona .note{font-size:14px;flex:1}
 .tag{display:inline-block;font-size:12px;padding:1px 8px;border-radius:10px;background:#dcebef;color:#12303a;margin-right:4px}
 .tag.code{background:#e7ddc8}
 button{font:inherit;cursor:pointer;border-radius:4px;padding:7px 12px;border:1px solid #1d4e5f;background:#1d4e5f;color:#fff;font-weight:700}
 button:hover{background:#12303a}
 button:focus-visible{outline:2px solid #e0a43a;outline-offset:2px}
 button.secondary{background:#fff;color:#1d4e5f}
 .attrs{font-size:12px;color:#5f6b7c}
</style>`;

export interface PickerOptions {
  personas: Persona[];
  samlRequest: string;
  relayState: string;
  roleValue: (persona: Persona) => string;
  cairnUrl: string;
}

export function pickerPage(o: PickerOptions): string {
  const hidden =
    `<input type="hidden" name="SAMLRequest" value="${escapeHtml(o.samlRequest)}">` +
    `<input type="hidden" name="RelayState" value="${escapeHtml(o.relayState)}">`;
  const cards = o.personas
    .map((p) => {
      const refused = /refused/i.test(p.note);
      const practices = p.practices.length
        ? p.practices.map((c) => `<span class="tag code">${escapeHtml(c)}</span>`).join('')
        : '<span class="attrs">no practice codes</span>';
      return `<form method="post" action="/idp/sso" class="persona${refused ? ' refused' : ''}">${hidden}
  <input type="hidden" name="persona" value="${escapeHtml(p.key)}">
  <h2>${escapeHtml(p.displayName)}</h2>
  <div class="email">${escapeHtml(p.email)}</div>
  <div><span class="tag">${escapeHtml(roleLabels[p.role])}</span>${practices}</div>
  <div class="note">${escapeHtml(p.note)}</div>
  <div class="attrs">role attribute: ${escapeHtml(o.roleValue(p))}</div>
  <button type="submit">Sign in as ${escapeHtml(p.displayName)}</button>
</form>`;
    })
    .join('\n');
  return page(
    'Local sign-in',
    `${styles}
<p class="intro">This page stands in for your organisation's single sign-on while Cairn runs on this machine.
Choose who to be: Cairn receives a signed SAML assertion with that person's e-mail, name, role and practice codes,
and then decides for itself whether to let them in.</p>
<div class="personas">${cards}</div>
<form method="post" action="/idp/sso">${hidden}<input type="hidden" name="action" value="cancel">
<button type="submit" class="secondary">Cancel and go back to Cairn</button></form>`,
  );
}

/** Posts the SAML response to Cairn's assertion consumer service (HTTP-POST binding). */
export function autoPostPage(acsUrl: string, samlResponse: string, relayState: string): string {
  return `<!doctype html><html lang="en-GB"><head><meta charset="utf-8"><title>Signing you in to Cairn</title></head>
<body style="font-family:system-ui,sans-serif;background:#f7f5f0;color:#1c2127;padding:40px">
<form method="post" action="${escapeHtml(acsUrl)}">
<input type="hidden" name="SAMLResponse" value="${escapeHtml(samlResponse)}">
${relayState ? `<input type="hidden" name="RelayState" value="${escapeHtml(relayState)}">` : ''}
<p>Signing you in to Cairn…</p>
<noscript><button type="submit">Continue to Cairn</button></noscript>
</form>
<script>document.forms[0].submit();</script>
</body></html>`;
}

export function idpErrorPage(title: string, detail: string): string {
  return page(title, `<p>${escapeHtml(detail)}</p>`);
}

export function signedOutPage(cairnUrl: string): string {
  return page(
    'Signed out of the local sign-in',
    `<p>You are signed out. <a href="${escapeHtml(cairnUrl)}/">Back to Cairn</a></p>`,
  );
}
