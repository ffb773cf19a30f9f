/**
 * Benchmark of the metrics engine (npm run bench -w @cairn/metrics; --quick or BENCH_QUICK=1
 * for 100k records only). One process:
 *  A. for 100k, 1M and 3.5M seeded synthetic records over 5,000 practices (50 localities):
 *     the full default measure set, per practice, locality and region, every type split and
 *     every breakdown, by the columnar path; the same with case mix; median of 5 runs after a
 *     warm-up; peak RSS;
 *  B. exact binomial funnel limits at 95 % and 99.8 % for every n in 1 … 5,000;
 *  C. the same records loaded into DuckDB (@duckdb/node-api, 2 threads) beforehand, and one
 *     query computing per practice and type group each care process done, all done, each
 *     target met and the denominators; median of 5 after a warm-up (load time excluded). Its
 *     rows are checked against ours, cell by cell.
 *  D. the benchmark sums at national size (bench/sums.ts: 7,000 practices and 3.5M records, a
 *     tenth with --quick): sums of every record, their bytes, the benchmark built from them and
 *     the incremental step, the views, and the column builder on database-shaped rows.
 * Targets: ours/DuckDB ≤ 0.5 at 1M and 3.5M; ≤ 250 MB extra RSS at 1M; funnel ≤ 20 ms;
 * building the benchmark from sums ≤ 400 ms (fastest run).
 * Exits non-zero when a target is missed or the results disagree.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  aggregateAt,
  type CareColumns,
  evaluateColumns,
  type EvaluationResult,
  funnelLimits,
  parseMeasureSet,
  reviewWindow,
} from '../src/index.js';
import { comparisonSql, loadIntoDuckDb, openDuckDb, runComparison } from './duckdb.js';
import { runSumsBenchmark } from './sums.js';
import { syntheticColumns, syntheticLocalities } from './synthetic.js';

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, '..', '..', '..');
const quick = process.argv.includes('--quick') || process.env.BENCH_QUICK === '1';
const SIZES = process.env.BENCH_SIZES
  ? process.env.BENCH_SIZES.split(',').map(Number)
  : quick
    ? [100_000]
    : [100_000, 1_000_000, 3_500_000];
const PRACTICES = 5_000;
const LOCALITIES = 50;
const SEED = 20261;
const RUNS = 5;
const QUARTER = { year: 2026, quarter: 3 } as const;
const window = reviewWindow(QUARTER);

const measureSet = parseMeasureSet(
  JSON.parse(
    readFileSync(join(root, 'config', 'measure-sets', 'cairn-default-2026.1.json'), 'utf8'),
  ),
);
const localities = syntheticLocalities(PRACTICES, LOCALITIES);

const gc = (globalThis as { gc?: () => void }).gc;
function collect(): void {
  if (gc) {
    gc();
    gc();
  }
}
const mb = (bytes: number): number => bytes / 1024 / 1024;
const rss = (): number => process.memoryUsage().rss;
const peakRss = (): number => process.resourceUsage().maxRSS * 1024;

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[s.length >> 1] as number;
}

async function timeRuns(run: () => unknown | Promise<unknown>): Promise<number> {
  collect();
  await run(); // warm-up
  const times: number[] = [];
  for (let k = 0; k < RUNS; k++) {
    collect();
    const t0 = performance.now();
    await run();
    times.push(performance.now() - t0);
  }
  return median(times);
}

function data(records: number): CareColumns {
  return syntheticColumns({
    records,
    practices: PRACTICES,
    seed: SEED + records,
    endMonthIndex: window.endIndex,
  });
}

/** The DuckDB query's columns, from our result, per practice and type group. */
const MEASURE_COLUMNS: [string, string][] = [
  ['hba1c', 'p0'],
  ['blood_pressure', 'p1'],
  ['cholesterol', 'p2'],
  ['serum_creatinine', 'p3'],
  ['urine_albumin', 'p4'],
  ['foot_surveillance', 'p5'],
  ['bmi', 'p6'],
  ['smoking', 'p7'],
  ['retinal_screening', 'p8'],
  ['all_processes', 'all_processes'],
  ['hba1c_le_48', 'hba1c_le_48'],
  ['hba1c_le_53', 'hba1c_le_53'],
  ['hba1c_le_58', 'hba1c_le_58'],
  ['hba1c_gt_75', 'hba1c_gt_75'],
  ['bp_target', 'bp_target'],
  ['bp_130_80', 'bp_130_80'],
  ['cholesterol_lt_5', 'cholesterol_lt_5'],
  ['statin_40_75', 'statin_40_75'],
  ['lipid_managed', 'lipid_managed'],
  ['targets_composite', 'targets_composite'],
];

/** Our values in the order of the DuckDB query's columns, for one practice and type group. */
function ourRow(result: EvaluationResult, p: number, g: 0 | 1): number[] {
  const split = g === 0 ? 'type1' : 'type2_other';
  const key = (k: string): number => result.measures.findIndex((m) => m.key === k);
  const at = (k: string) => aggregateAt(result, p, split, 0, key(k));
  const row = [p, g, at('hba1c').denominator];
  for (const [k] of MEASURE_COLUMNS.slice(0, 10)) row.push(at(k).events);
  row.push(at('hba1c_le_48').events, at('hba1c_le_53').events, at('hba1c_le_58').events);
  row.push(at('hba1c_gt_75').events, at('hba1c_gt_75').measured);
  row.push(at('bp_target').events, at('bp_130_80').events, at('bp_target').measured);
  row.push(at('cholesterol_lt_5').events, at('cholesterol_lt_5').measured);
  const statin = at('statin_40_75');
  row.push(statin.events, statin.denominator, statin.measured);
  row.push(at('lipid_managed').events, at('targets_composite').events);
  return row;
}

interface Row {
  records: number;
  ours: number;
  oursCaseMix: number;
  oursPracticeBreakdowns: number;
  duck: number | null;
  load: number | null;
  dataMb: number;
  extraMb: number;
  peakMb: number;
  agree: boolean | null;
}

async function main(): Promise<void> {
  const rows: Row[] = [];
  const expectedRows = new Map<number, number[][]>();
  console.log(
    `Cairn metrics benchmark: ${measureSet.id}, ${PRACTICES} practices, ${LOCALITIES} localities, ` +
      `${QUARTER.year} Q${QUARTER.quarter}, median of ${RUNS} runs after a warm-up` +
      (gc ? '' : ' (run with --expose-gc for steadier figures)'),
  );

  // A. Ours.
  for (const n of SIZES) {
    collect();
    const before = rss();
    const columns = data(n);
    collect();
    const dataMb = mb(rss() - before);
    // Each timed run is a complete evaluation whose result is then dropped.
    const ours = await timeRuns(() => {
      evaluateColumns(columns, measureSet, QUARTER, { localities, caseMix: false });
    });
    const extraMb = mb(peakRss() - before);
    const oursCaseMix = await timeRuns(() => {
      evaluateColumns(columns, measureSet, QUARTER, { localities, caseMix: true });
    });
    const oursPracticeBreakdowns = await timeRuns(() => {
      evaluateColumns(columns, measureSet, QUARTER, {
        localities,
        caseMix: false,
        practiceBreakdowns: true,
      });
    });
    const result = evaluateColumns(columns, measureSet, QUARTER, { localities, caseMix: true });
    const summary: number[][] = [];
    for (let p = 0; p < result.practices.length; p++) {
      for (const g of [0, 1] as const) {
        const row = ourRow(result, p, g);
        if ((row[2] as number) > 0) summary.push(row);
      }
    }
    expectedRows.set(n, summary);
    rows.push({
      records: n,
      ours,
      oursCaseMix,
      oursPracticeBreakdowns,
      duck: null,
      load: null,
      dataMb,
      extraMb,
      peakMb: mb(peakRss()),
      agree: null,
    });
    console.log(`  ours ${n.toLocaleString('en-GB')}: ${ours.toFixed(0)} ms`);
  }

  // B. Funnel limits for every n at two levels.
  const theta0 = 0.62;
  const funnel = await timeRuns(() => {
    for (let n = 1; n <= 5000; n++) {
      funnelLimits(theta0, n, 0.95);
      funnelLimits(theta0, n, 0.998);
    }
  });

  // C. DuckDB on the same data.
  const sql = comparisonSql(window);
  for (const row of rows) {
    collect();
    const columns = data(row.records);
    const { instance, connection } = await openDuckDb();
    const t0 = performance.now();
    await loadIntoDuckDb(connection, columns);
    row.load = performance.now() - t0;
    let result: number[][] = [];
    row.duck = await timeRuns(async () => {
      result = await runComparison(connection, sql);
    });
    const expected = expectedRows.get(row.records) ?? [];
    row.agree =
      result.length === expected.length &&
      result.every(
        (r, i) => r.length === expected[i]?.length && r.every((v, j) => v === expected[i]?.[j]),
      );
    if (!row.agree) {
      const i = result.findIndex((r, k) => r.some((v, j) => v !== expected[k]?.[j]));
      console.log(
        `  DuckDB disagrees at row ${i}: ${JSON.stringify(result[i])} vs ${JSON.stringify(expected[i])}`,
      );
    }
    connection.closeSync();
    instance.closeSync();
    console.log(`  DuckDB ${row.records.toLocaleString('en-GB')}: ${row.duck.toFixed(0)} ms`);
  }

  // Results.
  const fmt = (v: number | null, d = 0): string => (v === null ? '–' : v.toFixed(d));
  const header = [
    'records',
    'ours ms',
    '+case mix ms',
    '+practice breakdowns ms',
    'DuckDB ms',
    'ratio',
    'DuckDB load ms',
    'data MB',
    'extra RSS MB',
    'peak RSS MB',
    'agree',
  ];
  const table = rows.map((r) => [
    r.records.toLocaleString('en-GB'),
    fmt(r.ours),
    fmt(r.oursCaseMix),
    fmt(r.oursPracticeBreakdowns),
    fmt(r.duck),
    r.duck ? (r.ours / r.duck).toFixed(2) : '–',
    fmt(r.load),
    fmt(r.dataMb),
    fmt(r.extraMb),
    fmt(r.peakMb),
    r.agree === null ? '–' : r.agree ? 'yes' : 'NO',
  ]);
  const widths = header.map((h, i) =>
    Math.max(h.length, ...table.map((t) => (t[i] as string).length)),
  );
  const line = (cells: string[]): string =>
    cells.map((c, i) => c.padStart(widths[i] as number)).join('  ');
  console.log('');
  console.log(line(header));
  for (const t of table) console.log(line(t));
  console.log('');
  console.log(
    'ours: every measure per practice, locality and region, all type splits, breakdowns for\n' +
      'localities and the region (the default); +case mix: with indirect standardisation;\n' +
      '+practice breakdowns: breakdowns kept for every practice too. DuckDB: per practice and\n' +
      'type group (query only, load excluded). ratio = ours / DuckDB.',
  );
  console.log(`funnel limits, 95 % and 99.8 %, n = 1 … 5,000: ${funnel.toFixed(1)} ms`);
  console.log(`process peak RSS: ${mb(peakRss()).toFixed(0)} MB`);

  const failures: string[] = [];
  for (const r of rows) {
    if (r.agree === false) failures.push(`${r.records}: DuckDB and Cairn disagree`);
    if (r.records >= 1_000_000 && r.duck !== null && r.ours / r.duck > 0.5) {
      failures.push(`${r.records}: ratio ${(r.ours / r.duck).toFixed(2)} > 0.5`);
    }
    if (r.records === 1_000_000 && r.extraMb > 250) {
      failures.push(`1M: extra RSS ${r.extraMb.toFixed(0)} MB > 250 MB`);
    }
  }
  if (funnel > 20) failures.push(`funnel limits ${funnel.toFixed(1)} ms > 20 ms`);

  // D. Benchmark sums.
  console.log('');
  failures.push(...runSumsBenchmark({ quick }));
  console.log('');
  if (failures.length === 0) console.log('all targets met');
  else {
    for (const f of failures) console.log(`target missed: ${f}`);
    process.exitCode = 1;
  }
}

await main();
