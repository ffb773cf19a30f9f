/**
 * A report's data pack: what its sheets hold, for the region (regional leads
 * and auditors) and for one practice (its leads). Everything comes from the
 * report's snapshot. Wherever other practices appear, their counts are under
 * disclosure control (docs/methods.md §9): the peer tables frozen with the
 * report (two-way suppression), breakdowns of the region protected the same
 * way here, region totals alone with primary suppression.
 */
import { discloseCount, discloseRate } from '@cairn/metrics';
import type { MeasureDto } from '../measure-sets/dto/measure-set.dto.js';
import type {
  PracticeResultsDto,
  PracticeResultsWithDetailDto,
} from '../benchmarks/dto/practice-results.dto.js';
import type { DisclosedCellDto, PeerTableDto } from './dto/report.dto.js';
import { DECIMAL, INTEGER, type PackSheet, type PackValue, PERCENT } from './pack-writer.js';
import type { ReportRow } from './report.repository.js';
import { practicePeers, type ReportSnapshot } from './snapshot.js';

export type PackScope = { kind: 'region' } | { kind: 'practice'; practiceId: number };

const DISCLOSURE_TEXT =
  'Counts from 1 to 4 of other practices are shown as “< 5”; further counts are withheld where a total would give a small count away (rows and columns both); rates with a denominator under 10 are withheld. Your own practice’s figures are shown in full.';

const cell = (c: DisclosedCellDto): PackValue => (c.value === null ? c.display : c.value);

/** A count shown alone (a total): primary suppression. */
const total = (n: number): PackValue => {
  const d = discloseCount(n);
  return d.value === null ? d.display : d.value;
};

function measureRows(measures: readonly MeasureDto[]): PackValue[][] {
  return measures.map((m) => [
    m.key,
    m.label,
    m.kind === 'care_process' ? 'care process' : 'treatment target',
    m.definition,
    m.denominatorText,
    m.direction === 'higher' ? 'higher is better' : 'lower is better',
    m.source,
  ]);
}

function aboutSheet(
  row: ReportRow,
  snapshot: ReportSnapshot,
  measures: readonly MeasureDto[],
  what: string,
): PackSheet {
  const id = snapshot.identity;
  const facts: PackValue[][] = [
    ['What this is', what],
    ['Report', `${id.label} (report ${row.id})`],
    ['Audit quarter', id.quarter.label],
    ['Review window', `${id.quarter.windowStart} to ${id.quarter.windowEnd}`],
    ['Published', id.publishedAt],
    ['Published by', id.publishedBy.name],
    ['Release note', id.releaseNote],
    ['Content hash (SHA-256)', row.contentHash],
    ['Measure set', id.measureSetId],
    ['Submissions', snapshot.submissions.length],
    ['Permanent address', `/reports/${row.id}`],
    ['Disclosure control', DISCLOSURE_TEXT],
    ['Caution', snapshot.caution],
    [null, null],
    ['Measures', null],
  ];
  const header: PackValue[] = [
    'Key',
    'Measure',
    'Kind',
    'Definition',
    'Denominator',
    'Direction',
    'Guideline source',
  ];
  return {
    name: 'About',
    table: false,
    columns: [
      { header: 'About this data pack', width: 26 },
      { header: '', width: 60 },
      { header: '', width: 18 },
      { header: '', width: 60 },
      { header: '', width: 40 },
      { header: '', width: 18 },
      { header: '', width: 50 },
    ],
    rows: [...facts, header, ...measureRows(measures)],
  };
}

const BY_PRACTICE_COLUMNS = [
  { header: 'Practice code', width: 14 },
  { header: 'Practice', width: 32 },
  { header: 'Locality', width: 20 },
  { header: 'Measure key', width: 22 },
  { header: 'Measure', width: 36 },
  { header: 'Met', width: 10, format: INTEGER },
  { header: 'Not met', width: 10, format: INTEGER },
  { header: 'Denominator', width: 12, format: INTEGER },
  { header: 'Rate', width: 10, format: PERCENT },
];

function* byPracticeRows(
  tables: readonly PeerTableDto[],
  labels: ReadonlyMap<string, string>,
): Iterable<PackValue[]> {
  for (const t of tables) {
    const label = labels.get(t.measure) ?? t.measure;
    for (const r of t.rows) {
      yield [
        r.practice.code,
        r.practice.name,
        r.practice.localityName,
        t.measure,
        label,
        cell(r.met),
        cell(r.notMet),
        cell(r.n),
        r.rate,
      ];
    }
    yield [
      'Region',
      'All practices',
      null,
      t.measure,
      label,
      cell(t.met),
      cell(t.notMet),
      cell(t.n),
      t.rate,
    ];
  }
}

const FUNNEL_COLUMNS = [
  { header: 'Measure key', width: 22 },
  { header: 'Practice code', width: 14 },
  { header: 'Denominator', width: 12, format: INTEGER },
  { header: 'Rate', width: 10, format: PERCENT },
  { header: 'Inner limit, lower', width: 12, format: PERCENT },
  { header: 'Inner limit, upper', width: 12, format: PERCENT },
  { header: 'Outer limit, lower', width: 12, format: PERCENT },
  { header: 'Outer limit, upper', width: 12, format: PERCENT },
  { header: 'Band (exact limits)', width: 14 },
  { header: 'Side', width: 10 },
  { header: 'Region rate', width: 10, format: PERCENT },
  { header: 'Note', width: 30 },
];

/** Whether a practice's point may be shown: its met and n shown in the peer table, n ≥ 10. */
function pointShown(r: PeerTableDto['rows'][number] | undefined): boolean {
  if (!r) return false;
  if (r.own) return true;
  return (
    r.met.value !== null && r.n.value !== null && discloseRate(r.met.value, r.n.value) !== null
  );
}

function* funnelRows(snapshot: ReportSnapshot, tables: readonly PeerTableDto[], only?: string) {
  const byMeasure = new Map(
    tables.map((t) => [t.measure, new Map(t.rows.map((r) => [r.practice.code, r]))]),
  );
  for (const f of snapshot.region.funnels) {
    const rows = byMeasure.get(f.measure.key);
    for (const p of f.points) {
      if (only !== undefined && p.practice.code !== only) continue;
      if (!pointShown(rows?.get(p.practice.code))) {
        yield [
          f.measure.key,
          p.practice.code,
          null,
          null,
          null,
          null,
          null,
          null,
          null,
          null,
          f.region?.theta0 ?? null,
          'withheld (disclosure control)',
        ];
        continue;
      }
      yield [
        f.measure.key,
        p.practice.code,
        p.n,
        p.rate,
        p.exact.inner.lower,
        p.exact.inner.upper,
        p.exact.outer.lower,
        p.exact.outer.upper,
        p.exact.band,
        p.exact.side,
        f.region?.theta0 ?? null,
        null,
      ];
    }
  }
}

const BREAKDOWN_COLUMNS = [
  { header: 'Measure key', width: 22 },
  { header: 'Breakdown', width: 16 },
  { header: 'Category', width: 18 },
  { header: 'Met', width: 10, format: INTEGER },
  { header: 'Denominator', width: 12, format: INTEGER },
  { header: 'Rate', width: 10, format: PERCENT },
];

/** The region's breakdowns as frozen with the report (protected two ways). */
function* regionBreakdownRows(snapshot: ReportSnapshot): Iterable<PackValue[]> {
  const labels = snapshot.practices[0]?.results.detail?.breakdowns ?? [];
  for (const r of snapshot.region.breakdowns) {
    const b = labels.find((x) => x.key === r.breakdown);
    yield [
      r.measure,
      b?.label ?? r.breakdown,
      b?.categories.find((c) => c.key === r.category)?.label ?? r.category,
      cell(r.met),
      cell(r.n),
      r.rate,
    ];
  }
}

const PRACTICE_BREAKDOWN_COLUMNS = [
  { header: 'Measure key', width: 22 },
  { header: 'Breakdown', width: 16 },
  { header: 'Category', width: 18 },
  { header: 'Practice met', width: 12, format: INTEGER },
  { header: 'Practice denominator', width: 12, format: INTEGER },
  { header: 'Practice rate', width: 10, format: PERCENT },
  { header: 'Region met', width: 12, format: INTEGER },
  { header: 'Region denominator', width: 12, format: INTEGER },
  { header: 'Region rate', width: 10, format: PERCENT },
];

function* practiceBreakdownRows(detail: NonNullable<PracticeResultsWithDetailDto['detail']>) {
  for (const m of detail.measures) {
    const everyone = m.splits.find((s) => s.split === 'all');
    if (!everyone) continue;
    for (const b of everyone.breakdowns) {
      const labels = detail.breakdowns.find((x) => x.key === b.breakdown);
      for (const c of b.cells) {
        yield [
          m.measure,
          labels?.label ?? b.breakdown,
          labels?.categories.find((x) => x.key === c.category)?.label ?? c.category,
          c.practice.events,
          c.practice.n,
          c.practice.rate,
          c.region.events.value ?? c.region.events.display,
          c.region.n.value ?? c.region.n.display,
          c.region.rate,
        ];
      }
    }
  }
}

const TREND_COLUMNS = [
  { header: 'Measure key', width: 22 },
  { header: 'Quarter', width: 10 },
  { header: 'State', width: 18 },
  { header: 'Met', width: 10, format: INTEGER },
  { header: 'Denominator', width: 12, format: INTEGER },
  { header: 'Rate', width: 10, format: PERCENT },
];

function* regionTrendRows(snapshot: ReportSnapshot) {
  for (const t of snapshot.region.trends) {
    for (let i = 0; i < t.quarters.length; i++) {
      const p = t.region.points[i]!;
      const shown = p.state === 'value';
      const events = shown ? total(p.events) : null;
      const rest = shown ? total(p.n - p.events) : null;
      const rate =
        shown && typeof events === 'number' && typeof rest === 'number'
          ? discloseRate(p.events, p.n)
          : null;
      yield [
        t.measure.key,
        t.quarters[i]!.quarterLabel,
        p.state,
        events,
        shown ? total(p.n) : null,
        rate,
      ];
    }
  }
}

const RESULTS_COLUMNS = [
  { header: 'Measure key', width: 22 },
  { header: 'Measure', width: 36 },
  { header: 'People', width: 14 },
  { header: 'Met', width: 10, format: INTEGER },
  { header: 'Denominator', width: 12, format: INTEGER },
  { header: 'Rate', width: 10, format: PERCENT },
  { header: '95% interval, lower', width: 12, format: PERCENT },
  { header: '95% interval, upper', width: 12, format: PERCENT },
  { header: 'Band (exact limits)', width: 14 },
  { header: 'Side', width: 10 },
  { header: 'Band (adjusted limits)', width: 14 },
  { header: 'Region rate', width: 10, format: PERCENT },
  { header: 'Region median', width: 10, format: PERCENT },
  { header: 'Change since previous quarter', width: 14, format: PERCENT },
  { header: 'Guideline source', width: 40 },
];

const SPLIT_WORDS: Record<string, string> = {
  all: 'everyone',
  type1: 'type 1',
  type2_other: 'type 2 and other',
};

function* practiceResultRows(results: PracticeResultsDto) {
  for (const m of results.measures) {
    for (const s of m.splits) {
      yield [
        m.measure.key,
        m.measure.label,
        SPLIT_WORDS[s.split] ?? s.split,
        s.own.events,
        s.own.n,
        s.own.rate,
        s.own.interval.lower,
        s.own.interval.upper,
        s.own.exact.band,
        s.own.exact.side,
        s.own.adjusted.band,
        s.region.rate,
        s.region.median,
        s.change?.difference ?? null,
        m.measure.source,
      ];
    }
  }
}

const PRACTICE_TREND_COLUMNS = [
  { header: 'Measure key', width: 22 },
  { header: 'Quarter', width: 10 },
  { header: 'State', width: 18 },
  { header: 'Met', width: 10, format: INTEGER },
  { header: 'Denominator', width: 12, format: INTEGER },
  { header: 'Rate', width: 10, format: PERCENT },
  { header: 'Region rate', width: 10, format: PERCENT },
];

function* practiceTrendRows(results: PracticeResultsDto) {
  for (const m of results.measures) {
    const s = m.splits.find((x) => x.split === 'all');
    if (!s) continue;
    for (let i = 0; i < results.quarters.length; i++) {
      const p = s.trend.points[i];
      const r = s.regionTrend.points[i];
      if (!p) continue;
      const shown = p.state === 'value';
      yield [
        m.measure.key,
        results.quarters[i]!.quarterLabel,
        p.state,
        shown ? p.events : null,
        shown ? p.n : null,
        p.rate,
        r && r.state === 'value' ? regionRateShown(r.events, r.n) : null,
      ];
    }
  }
}

/** A region rate alone: withheld when its events or non-events are 1–4 or n is under 10. */
function regionRateShown(events: number, n: number): number | null {
  if (typeof total(events) !== 'number' || typeof total(n - events) !== 'number') return null;
  return discloseRate(events, n);
}

const REGION_COLUMNS = [
  { header: 'Measure key', width: 22 },
  { header: 'Measure', width: 36 },
  { header: 'People', width: 14 },
  { header: 'Met', width: 10, format: INTEGER },
  { header: 'Denominator', width: 12, format: INTEGER },
  { header: 'Region rate', width: 10, format: PERCENT },
  { header: 'Median of practices', width: 12, format: PERCENT },
  { header: 'Practices', width: 10, format: INTEGER },
  { header: 'Over-dispersion φ', width: 12, format: DECIMAL },
  { header: 'Guideline source', width: 40 },
];

function* regionRows(snapshot: ReportSnapshot): Iterable<PackValue[]> {
  const everyone = new Map(snapshot.region.peerTables.map((t) => [t.measure, t]));
  for (const split of snapshot.region.splits) {
    for (let i = 0; i < split.measures.length; i++) {
      const m = split.measures[i]!;
      const r = split.region[i];
      if (!r) continue;
      const table = split.split === 'all' ? everyone.get(m.key) : undefined;
      const met = table ? cell(table.met) : total(r.events);
      const n = table ? cell(table.n) : total(r.n);
      const rest = total(r.n - r.events);
      const rate =
        typeof met === 'number' && typeof n === 'number' && typeof rest === 'number'
          ? discloseRate(met, n)
          : null;
      yield [
        m.key,
        m.label,
        SPLIT_WORDS[split.split] ?? split.split,
        met,
        n,
        rate,
        r.median,
        r.practices,
        r.overdispersion?.phi ?? null,
        m.source,
      ];
    }
  }
}

/**
 * What one data pack shows: the region's (every practice protected) or one practice's (its own
 * figures in full, the others protected). Both packs have the same sheets, in the same order.
 */
interface PackView {
  /** The about sheet's "What this is" */
  what: string;
  /** The second sheet: the region's figures, or the practice's own results */
  headline: PackSheet;
  /** Each measure's practices (everyone) */
  peers: readonly PeerTableDto[];
  /** The one practice whose funnel points are listed (every practice's when undefined) */
  funnelPractice?: string;
  breakdowns: Pick<PackSheet, 'columns' | 'rows'>;
  trends: Pick<PackSheet, 'columns' | 'rows'>;
}

function regionView(snapshot: ReportSnapshot): PackView {
  return {
    what: `The data pack of a published Cairn report for the whole region: every practice on every measure, the funnel data with its limits, the region's breakdowns and trends. Other practices' counts are under disclosure control.`,
    headline: { name: 'Region', columns: REGION_COLUMNS, rows: regionRows(snapshot) },
    peers: snapshot.region.peerTables,
    breakdowns: { columns: BREAKDOWN_COLUMNS, rows: regionBreakdownRows(snapshot) },
    trends: { columns: TREND_COLUMNS, rows: regionTrendRows(snapshot) },
  };
}

function practiceView(snapshot: ReportSnapshot, practiceId: number): PackView {
  const part = snapshot.practices.find((p) => p.practice.id === practiceId);
  if (!part) throw new Error(`practice ${practiceId} has no results in this report`);
  const results = part.results;
  return {
    what: `The data pack of a published Cairn report for ${part.practice.code} ${part.practice.name}: its results on every measure against the region, the region's practices under disclosure control, its funnel data, breakdowns and trends.`,
    headline: { name: 'Your results', columns: RESULTS_COLUMNS, rows: practiceResultRows(results) },
    peers: practicePeers(snapshot, practiceId),
    funnelPractice: part.practice.code,
    breakdowns: {
      columns: PRACTICE_BREAKDOWN_COLUMNS,
      rows: results.detail ? practiceBreakdownRows(results.detail) : [],
    },
    trends: { columns: PRACTICE_TREND_COLUMNS, rows: practiceTrendRows(results) },
  };
}

/** The sheets of a report's data pack. */
export function packSheets(
  row: ReportRow,
  snapshot: ReportSnapshot,
  scope: PackScope,
): PackSheet[] {
  const measures = snapshot.region.splits[0]?.measures ?? [];
  const labels = new Map(measures.map((m) => [m.key, m.label]));
  const view =
    scope.kind === 'region' ? regionView(snapshot) : practiceView(snapshot, scope.practiceId);
  return [
    aboutSheet(row, snapshot, measures, view.what),
    view.headline,
    {
      name: 'Measures by practice',
      columns: BY_PRACTICE_COLUMNS,
      rows: byPracticeRows(view.peers, labels),
    },
    {
      name: 'Funnel data',
      columns: FUNNEL_COLUMNS,
      rows: funnelRows(snapshot, view.peers, view.funnelPractice),
    },
    { name: 'Breakdowns', ...view.breakdowns },
    { name: 'Trends', ...view.trends },
  ];
}
