/**
 * A report as PDF, made on the server with pdfkit (pure JavaScript): Lato
 * embedded from @fontsource's files, charts drawn as vectors, every page
 * footed with the report's identity, its content hash, the caution and the
 * page number. Grey-scale readable: the practice is a filled circle, the
 * region a vertical line, limits dashed; nothing is told by colour alone.
 *
 * The region's report (regional leads, auditors): each measure's region
 * figures and its funnel plot, practices whose counts are under disclosure
 * control left out. A practice's report: its results on every measure (as its
 * leads see them), each with its 95 % interval, the region's rate and the
 * funnel limits at its n.
 */
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import type { Writable } from 'node:stream';
import PDFDocument from 'pdfkit';
import { discloseRate } from '@cairn/metrics';
import type { MeasureFunnelDto } from '../benchmarks/dto/benchmark.dto.js';
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';
import type { PeerTableDto } from './dto/report.dto.js';
import type { PackScope } from './pack.js';
import type { ReportRow } from './report.repository.js';
import type { ReportSnapshot } from './snapshot.js';

const require = createRequire(import.meta.url);
let fonts: { regular: Buffer; bold: Buffer } | null = null;
function lato() {
  fonts ??= {
    regular: readFileSync(require.resolve('@fontsource/lato/files/lato-latin-400-normal.woff')),
    bold: readFileSync(require.resolve('@fontsource/lato/files/lato-latin-700-normal.woff')),
  };
  return fonts;
}

const INK = '#1f2a30';
const GREY = '#6b7378';
const LIGHT = '#d5d9dc';
const MARGIN = 48;
const FOOTER = 54;

type Doc = InstanceType<typeof PDFDocument>;

export const percent = (x: number | null | undefined, digits = 1): string =>
  x === null || x === undefined ? '–' : `${(x * 100).toFixed(digits)} %`;

const BAND_WORDS: Record<string, string> = {
  within: 'within limits',
  notable: 'beyond inner limit',
  outlier: 'beyond outer limit',
};

function band(flag: { band: string | null; side: string | null }): string {
  if (!flag.band) return '–';
  const words = BAND_WORDS[flag.band] ?? flag.band;
  return flag.band === 'within' || !flag.side ? words : `${words} (${flag.side})`;
}

function newDoc(row: ReportRow, snapshot: ReportSnapshot, title: string): Doc {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: MARGIN, left: MARGIN, right: MARGIN, bottom: FOOTER + 12 },
    bufferPages: true,
    info: {
      Title: title,
      Author: 'Cairn',
      Subject: `${snapshot.identity.label}; content hash ${row.contentHash}`,
      CreationDate: new Date(snapshot.identity.publishedAt),
      ModDate: new Date(snapshot.identity.publishedAt),
    },
  });
  const f = lato();
  doc.registerFont('Lato', f.regular);
  doc.registerFont('Lato-Bold', f.bold);
  doc.font('Lato').fillColor(INK);
  return doc;
}

function header(doc: Doc, row: ReportRow, snapshot: ReportSnapshot, title: string): void {
  const id = snapshot.identity;
  doc.font('Lato-Bold').fontSize(18).text(title);
  doc.moveDown(0.2);
  doc
    .font('Lato')
    .fontSize(10)
    .fillColor(GREY)
    .text(
      `${id.label} · audit quarter ${id.quarter.label} (review window ${id.quarter.windowStart} to ${id.quarter.windowEnd}) · measure set ${id.measureSetId}`,
    )
    .text(
      `Published ${id.publishedAt.slice(0, 16).replace('T', ' ')} UTC by ${id.publishedBy.name} · ${snapshot.submissions.length} submissions · report ${row.id}`,
    )
    .text(`Content hash (SHA-256): ${row.contentHash}`);
  doc.moveDown(0.5);
  doc.fillColor(INK).font('Lato-Bold').fontSize(10).text('Release note');
  doc.font('Lato').text(id.releaseNote);
  doc.moveDown(0.5);
  const y = doc.y;
  const width = doc.page.width - 2 * MARGIN;
  const text = `Caution: ${snapshot.caution} Each measure names the guideline behind it.`;
  const h = doc.heightOfString(text, { width: width - 16 }) + 12;
  doc.rect(MARGIN, y, width, h).lineWidth(1).strokeColor(GREY).stroke();
  doc.fillColor(INK).text(text, MARGIN + 8, y + 6, { width: width - 16 });
  doc.x = MARGIN;
  doc.y = y + h + 10;
}

function footers(doc: Doc, row: ReportRow, snapshot: ReportSnapshot): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    // The footer sits in the bottom margin: without this pdfkit would start a new page for it.
    const margin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const bottom = doc.page.height - FOOTER;
    const width = doc.page.width - 2 * MARGIN;
    doc.save();
    doc
      .moveTo(MARGIN, bottom)
      .lineTo(MARGIN + width, bottom)
      .lineWidth(0.5)
      .strokeColor(LIGHT)
      .stroke();
    doc.font('Lato').fontSize(7).fillColor(GREY);
    doc.text(
      `Cairn · ${snapshot.identity.label} (report ${row.id}) · content hash ${row.contentHash.slice(0, 16)}…`,
      MARGIN,
      bottom + 5,
      { width: width - 80, lineBreak: false },
    );
    doc.text(`Page ${i + 1} of ${range.count}`, MARGIN + width - 80, bottom + 5, {
      width: 80,
      align: 'right',
      lineBreak: false,
    });
    doc.text(
      'Audit and improvement support, not clinical advice: follow local guidelines and clinical judgement.',
      MARGIN,
      bottom + 16,
      { width, lineBreak: false },
    );
    doc.restore();
    doc.page.margins.bottom = margin;
  }
}

function ensureSpace(doc: Doc, height: number): void {
  if (doc.y + height > doc.page.height - FOOTER - 12) doc.addPage();
}

/** A 0–100 % scale with the practice's rate (circle), its interval, the region (line), limits (dashed). */
function rateStrip(
  doc: Doc,
  x: number,
  y: number,
  width: number,
  s: {
    rate: number | null;
    lower: number | null;
    upper: number | null;
    region: number | null;
    outer: { lower: number | null; upper: number | null };
  },
): void {
  const at = (v: number) => x + Math.max(0, Math.min(1, v)) * width;
  doc.save();
  doc
    .moveTo(x, y + 6)
    .lineTo(x + width, y + 6)
    .lineWidth(0.5)
    .strokeColor(LIGHT)
    .stroke();
  for (const t of [0, 0.5, 1]) {
    doc
      .moveTo(at(t), y + 3)
      .lineTo(at(t), y + 9)
      .strokeColor(LIGHT)
      .stroke();
  }
  if (s.outer.lower !== null && s.outer.upper !== null) {
    doc
      .moveTo(at(s.outer.lower), y)
      .lineTo(at(s.outer.lower), y + 12)
      .moveTo(at(s.outer.upper), y)
      .lineTo(at(s.outer.upper), y + 12)
      .dash(1.5, { space: 1.5 })
      .lineWidth(0.8)
      .strokeColor(GREY)
      .stroke()
      .undash();
  }
  if (s.region !== null) {
    doc
      .moveTo(at(s.region), y - 1)
      .lineTo(at(s.region), y + 13)
      .lineWidth(1.4)
      .strokeColor(INK)
      .stroke();
  }
  if (s.lower !== null && s.upper !== null) {
    doc
      .moveTo(at(s.lower), y + 6)
      .lineTo(at(s.upper), y + 6)
      .lineWidth(1.2)
      .strokeColor(INK)
      .stroke();
  }
  if (s.rate !== null)
    doc
      .circle(at(s.rate), y + 6, 3)
      .fillColor(INK)
      .fill();
  doc.restore();
}

function legend(doc: Doc): void {
  const y = doc.y;
  const x = MARGIN;
  rateStrip(doc, x, y, 60, {
    rate: 0.5,
    lower: 0.35,
    upper: 0.65,
    region: 0.2,
    outer: { lower: 0.1, upper: 0.9 },
  });
  doc
    .font('Lato')
    .fontSize(8)
    .fillColor(GREY)
    .text(
      'Filled circle: the practice’s rate, with its 95 % interval (Wilson). Solid vertical line: the region’s rate. Dashed marks: the outer funnel limits (99.8 %, exact binomial) at the practice’s denominator. Scale 0 to 100 %.',
      x + 70,
      y - 2,
      { width: doc.page.width - 2 * MARGIN - 70 },
    );
  doc.x = MARGIN;
  doc.moveDown(0.8);
}

function practicePages(doc: Doc, results: PracticeResultsDto): void {
  const width = doc.page.width - 2 * MARGIN;
  doc.font('Lato-Bold').fontSize(12).fillColor(INK).text('Results on every measure (everyone)');
  doc.moveDown(0.3);
  legend(doc);
  const cols = [150, 52, 48, 76, 48, width - 150 - 52 - 48 - 76 - 48];
  const heads = ['Measure', 'Met / n', 'Rate', '95 % interval', 'Region', 'Against the region'];
  const row = (cells: string[], bold = false) => {
    const y = doc.y;
    let x = MARGIN;
    doc
      .font(bold ? 'Lato-Bold' : 'Lato')
      .fontSize(8.5)
      .fillColor(INK);
    let h = 0;
    cells.forEach((c, i) => {
      doc.text(c, x, y, { width: cols[i]! - 4 });
      h = Math.max(h, doc.y - y);
      x += cols[i]!;
    });
    doc.x = MARGIN;
    doc.y = y + h;
  };
  row(heads, true);
  for (const m of results.measures) {
    const s = m.splits.find((x) => x.split === 'all');
    if (!s) continue;
    ensureSpace(doc, 58);
    doc
      .moveTo(MARGIN, doc.y + 2)
      .lineTo(MARGIN + width, doc.y + 2)
      .lineWidth(0.4)
      .strokeColor(LIGHT)
      .stroke();
    doc.y += 5;
    row([
      m.measure.label,
      `${s.own.events} / ${s.own.n}`,
      percent(s.own.rate),
      `${percent(s.own.interval.lower)} – ${percent(s.own.interval.upper)}`,
      percent(s.region.rate),
      band(s.own.exact),
    ]);
    const y = doc.y + 2;
    rateStrip(doc, MARGIN + 150, y, 200, {
      rate: s.own.rate,
      lower: s.own.interval.lower,
      upper: s.own.interval.upper,
      region: s.region.rate,
      outer: s.own.exact.outer,
    });
    doc
      .font('Lato')
      .fontSize(7)
      .fillColor(GREY)
      .text(`Guideline: ${m.measure.source}`, MARGIN, y + 16, { width });
    doc.fillColor(INK);
    doc.moveDown(0.2);
  }
}

/** A funnel plot: rate against denominator, the exact limits as curves, practices as points. */
function funnelPlot(doc: Doc, f: MeasureFunnelDto, table: PeerTableDto | undefined): void {
  const width = doc.page.width - 2 * MARGIN;
  const plotH = 170;
  ensureSpace(doc, plotH + 70);
  doc.font('Lato-Bold').fontSize(10).fillColor(INK).text(f.measure.label);
  doc
    .font('Lato')
    .fontSize(8)
    .fillColor(GREY)
    .text(
      `Region ${percent(f.region?.theta0)} · median of practices ${percent(f.region?.median)} · guideline: ${f.measure.source}`,
      { width },
    );
  const top = doc.y + 4;
  const left = MARGIN + 34;
  const plotW = width - 40;
  const shown = new Set(
    (table?.rows ?? [])
      .filter(
        (r) =>
          r.met.value !== null &&
          r.n.value !== null &&
          discloseRate(r.met.value, r.n.value) !== null,
      )
      .map((r) => r.practice.code),
  );
  const points = f.points.filter((p) => shown.has(p.practice.code) && p.rate !== null);
  const maxN = Math.max(10, ...f.points.map((p) => p.n), ...(f.curves?.n ?? [0]));
  const X = (n: number) => left + (n / maxN) * plotW;
  const Y = (r: number) => top + (1 - Math.max(0, Math.min(1, r))) * plotH;
  doc.save();
  doc.rect(left, top, plotW, plotH).lineWidth(0.5).strokeColor(LIGHT).stroke();
  doc.font('Lato').fontSize(7).fillColor(GREY);
  for (const t of [0, 0.25, 0.5, 0.75, 1]) {
    doc
      .moveTo(left, Y(t))
      .lineTo(left + plotW, Y(t))
      .lineWidth(0.3)
      .strokeColor(LIGHT)
      .stroke();
    doc.text(`${t * 100} %`, MARGIN, Y(t) - 3, { width: 30, align: 'right', lineBreak: false });
  }
  doc.text(`denominator (0 to ${maxN})`, left, top + plotH + 3, {
    width: plotW,
    align: 'center',
    lineBreak: false,
  });
  const curve = (ys: number[] | undefined, dashed: boolean) => {
    const ns = f.curves?.n ?? [];
    if (!ys || ns.length === 0) return;
    ns.forEach((n, i) => {
      const v = ys[i]!;
      if (i === 0) doc.moveTo(X(n), Y(v));
      else doc.lineTo(X(n), Y(v));
    });
    if (dashed) doc.dash(2, { space: 2 });
    doc
      .lineWidth(0.8)
      .strokeColor(dashed ? GREY : INK)
      .stroke();
    doc.undash();
  };
  if (f.curves) {
    curve(f.curves.exact.innerLower, true);
    curve(f.curves.exact.innerUpper, true);
    curve(f.curves.exact.outerLower, false);
    curve(f.curves.exact.outerUpper, false);
  }
  if (f.region?.theta0 !== null && f.region?.theta0 !== undefined) {
    doc
      .moveTo(left, Y(f.region.theta0))
      .lineTo(left + plotW, Y(f.region.theta0))
      .lineWidth(1)
      .strokeColor(INK)
      .stroke();
  }
  for (const p of points) {
    const x = X(p.n);
    const y = Y(p.rate!);
    if (p.exact.band === 'outlier') {
      doc
        .rect(x - 3, y - 3, 6, 6)
        .fillColor(INK)
        .fill();
    } else if (p.exact.band === 'notable') {
      doc
        .polygon([x, y - 3.5], [x + 3.5, y + 3], [x - 3.5, y + 3])
        .fillColor(GREY)
        .fill();
    } else {
      doc.circle(x, y, 2.4).lineWidth(0.8).strokeColor(INK).stroke();
    }
  }
  doc.restore();
  doc.x = MARGIN;
  doc.y = top + plotH + 14;
  const withheld = f.points.length - points.length;
  doc
    .font('Lato')
    .fontSize(7.5)
    .fillColor(GREY)
    .text(
      `Open circle: within the limits; triangle: beyond the inner (95 %) limit; square: beyond the outer (99.8 %) limit. Solid curves: outer limits; dashed: inner limits; horizontal line: the region's rate.${withheld > 0 ? ` ${withheld} practices left out under disclosure control.` : ''}`,
      { width },
    );
  doc.fillColor(INK);
  doc.moveDown(0.8);
}

function regionPages(doc: Doc, snapshot: ReportSnapshot): void {
  const width = doc.page.width - 2 * MARGIN;
  const all = snapshot.region.splits[0];
  if (!all) return;
  doc.font('Lato-Bold').fontSize(12).fillColor(INK).text('The region on every measure (everyone)');
  doc.moveDown(0.3);
  const cols = [170, 60, 60, 60, width - 350];
  const line = (cells: string[], bold = false) => {
    const y = doc.y;
    let x = MARGIN;
    let h = 0;
    doc
      .font(bold ? 'Lato-Bold' : 'Lato')
      .fontSize(8.5)
      .fillColor(INK);
    cells.forEach((c, i) => {
      doc.text(c, x, y, { width: cols[i]! - 4 });
      h = Math.max(h, doc.y - y);
      x += cols[i]!;
    });
    doc.x = MARGIN;
    doc.y = y + h + 2;
  };
  line(
    ['Measure', 'Region rate', 'Median', 'Practices', 'Beyond the outer limits (below / above)'],
    true,
  );
  const tables = new Map(snapshot.region.peerTables.map((t) => [t.measure, t]));
  all.measures.forEach((m, i) => {
    const r = all.region[i]!;
    const f = snapshot.region.funnels.find((x) => x.measure.key === m.key);
    const below =
      f?.points.filter((p) => p.exact.band === 'outlier' && p.exact.side === 'below').length ?? 0;
    const above =
      f?.points.filter((p) => p.exact.band === 'outlier' && p.exact.side === 'above').length ?? 0;
    ensureSpace(doc, 14);
    line([
      m.label,
      percent(tables.get(m.key)?.rate ?? null),
      percent(r.median),
      String(r.practices),
      `${below} / ${above}`,
    ]);
  });
  doc.addPage();
  doc.font('Lato-Bold').fontSize(12).fillColor(INK).text('Funnel plots');
  doc.moveDown(0.3);
  for (const f of snapshot.region.funnels) funnelPlot(doc, f, tables.get(f.measure.key));
}

/** Writes the PDF of a report (region, or one practice as its leads see it) to `stream`. */
export function writeReportPdf(
  row: ReportRow,
  snapshot: ReportSnapshot,
  scope: PackScope,
  stream: Writable,
): Promise<void> {
  const part =
    scope.kind === 'practice'
      ? snapshot.practices.find((p) => p.practice.id === scope.practiceId)
      : undefined;
  if (scope.kind === 'practice' && !part) {
    throw new Error(`practice ${scope.practiceId} has no results in this report`);
  }
  const title = part
    ? `${part.practice.code} ${part.practice.name}: diabetes care report`
    : `The region's diabetes care report`;
  const doc = newDoc(row, snapshot, title);
  const done = new Promise<void>((resolve, reject) => {
    stream.on('finish', resolve);
    stream.on('error', reject);
  });
  doc.pipe(stream);
  header(doc, row, snapshot, title);
  if (part) practicePages(doc, part.results);
  else regionPages(doc, snapshot);
  footers(doc, row, snapshot);
  doc.end();
  return done;
}
