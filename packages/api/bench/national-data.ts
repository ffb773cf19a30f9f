/**
 * Benchmark data at national and at region size, in the test MariaDB (never
 * the demo data), and the reference a recompute from records is judged
 * against: a bare streamed SELECT of every column the metrics read, for all
 * current records of an audit quarter.
 *
 *   national  7,000 practices (N00001 …), 3,500,000 care records
 *   region      300 practices (R00001 …),   300,000 care records
 *
 * Each variant lives in a database of its own (cairn_test_bench_national,
 * cairn_test_bench_region), is generated once — deterministically from SEED:
 * the same rows on every machine — and reused by later runs. A run finds an
 * audit event `bench.data_generated` whose detail names this generator's
 * version, seed and sizes; without it (first run, an interrupted one, an
 * older generator) the database is dropped and generated again. Everything is
 * invented: one region, its localities and practices, one audit quarter
 * (2026 Q3, closed), one accepted, current submission per practice, and about
 * 500 (national) or 1,000 (region) records a practice with plausible values.
 * Records go in through LOAD DATA LOCAL INFILE, as the record loader stages
 * them (src/records/record-loader.ts: the connector's infileStreamFactory fed
 * LOAD DATA text by TsvEncoder), in statements of STATEMENT_ROWS rows, the
 * next statement encoded while MariaDB stores the previous one.
 *
 * The reads (`measureReads`), each on a connection of the mariadb connector
 * of its own, in its fastest form — `queryStream`, rows as arrays, no type
 * cast function (Sequelize's connections install one, called for every
 * field):
 *   1. months as strings, nothing done with the rows (the reference);
 *   2. the same rows, each month parsed into a month index (monthIndex of
 *      @cairn/metrics), as the columnar builder does;
 *   3. months computed as month indices by MariaDB (year × 12 + month − 1), so
 *      they arrive as numbers;
 * and, for scale, the same rows read and summarised inside MariaDB with
 * nothing sent (the server's own share of the reference).
 *
 * Run alone: `node --import tsx/esm bench/national-data.ts [--region-only]`
 * (the test MariaDB must be running: `npm run db:start -- --profile test`).
 * `npm run bench` runs it as its last section; with `--quick` only when
 * `--national` is given too.
 */
import { createHmac } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { monthIndex, pseudonymMessage, PSEUDONYM_LENGTH } from '@cairn/metrics';
import mariadb from 'mariadb';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { CairnConfig, CairnSecrets } from '../src/config/config.schema.js';
import { findRepoRoot, loadConfig, loadSecrets } from '../src/config/load-config.js';
import { connect, createDatabase, dropTestDatabase } from '../src/database/connect.js';
import { migrateUp } from '../src/database/migrator.js';
import { acquireRaw, releaseRaw } from '../src/database/bulk-load/raw-connection.js';
import {
  CARE_COLUMNS,
  RECORD_COLUMNS,
  type RecordRow,
} from '../src/database/bulk-load/record-columns.js';
import { LOAD_RECORDS_SQL } from '../src/database/bulk-load/record-loader.js';
import { TsvEncoder } from '../src/database/bulk-load/tsv-encoder.js';

/** Change when the generated rows change: older data is then generated again. */
const GENERATOR_VERSION = 1;
const SEED = 20_261_201;
const STATEMENT_ROWS = 50_000;
const QUARTER = { year: 2026, quarter: 3 as const };
const MEASURE_SET = 'cairn-default-2026.1';
/** The pseudonyms' key: bench data only */
const BENCH_SECRET = 'cairn-bench-pseudonym-key';

export interface Variant {
  name: 'national' | 'region';
  database: string;
  regionCode: string;
  prefix: string;
  practices: number;
  /** Mean records a practice (the total is exactly practices × mean) */
  meanRecords: number;
  localities: number;
}

export const VARIANTS: Record<Variant['name'], Variant> = {
  national: {
    name: 'national',
    database: 'cairn_test_bench_national',
    regionCode: 'BENCH-NATION',
    prefix: 'N',
    practices: 7000,
    meanRecords: 500,
    localities: 42,
  },
  region: {
    name: 'region',
    database: 'cairn_test_bench_region',
    regionCode: 'BENCH-REGION',
    prefix: 'R',
    practices: 300,
    meanRecords: 1000,
    localities: 6,
  },
};

const records = (v: Variant) => v.practices * v.meanRecords;

// ── deterministic random numbers ───────────────────────────────────────────

/** mulberry32: a small, fast 32-bit generator (public domain); enough for invented data. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A normal deviate (Box–Muller). */
function normal(rand: () => number, mean: number, sd: number): number {
  const u = Math.max(rand(), 1e-12);
  return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));
const round1 = (x: number) => Math.round(x * 10) / 10;

/** Records of each practice: mean ± up to 70 %, in pairs that sum to twice the mean. */
export function practiceSizes(v: Variant): number[] {
  const rand = random(SEED ^ v.practices);
  const sizes: number[] = [];
  for (let p = 0; p < v.practices; p += 2) {
    const d = Math.round((rand() * 2 - 1) * 0.7 * v.meanRecords);
    sizes.push(v.meanRecords + d);
    if (p + 1 < v.practices) sizes.push(v.meanRecords - d);
  }
  return sizes;
}

// ── one practice's records ─────────────────────────────────────────────────

const WINDOW_START = QUARTER.year * 12 + QUARTER.quarter * 3 - 12; // 2025-10
const monthText = (index: number) =>
  `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}`;

/** Base chance that a care process is recorded in the review window. */
const RECORDED = {
  hba1c: 0.93,
  bp: 0.94,
  cholesterol: 0.85,
  creatinine: 0.9,
  acr: 0.62,
  foot: 0.8,
  bmi: 0.88,
  smoking: 0.86,
  retinal: 0.8,
};

/**
 * Generates the rows of one practice (RECORD_COLUMNS order), `submissionId`
 * set. Each practice has its own recording habits (a factor on every chance)
 * and its own glycaemic control, so that practices differ as real ones do.
 */
export function practiceRows(
  practiceIndex: number,
  code: string,
  count: number,
  submissionId: number,
  pseudonym: (code: string, ref: string) => string,
): RecordRow[] {
  const rand = random(SEED + practiceIndex * 7919);
  const habit = 0.8 + rand() * 0.22;
  const control = normal(rand, 0, 4);
  const rows: RecordRow[] = [];
  const inWindow = (chance: number): string | null => {
    const r = rand();
    if (r < Math.min(0.995, chance * habit))
      return monthText(WINDOW_START + Math.floor(rand() * 12));
    if (r < Math.min(0.995, chance * habit) + 0.05)
      return monthText(WINDOW_START - 1 - Math.floor(rand() * 18));
    return null;
  };
  for (let i = 0; i < count; i++) {
    const ref = `${code}-${String(i + 1).padStart(6, '0')}`;
    const t = rand();
    const type = t < 0.08 ? 'type1' : t < 0.96 ? 'type2' : t < 0.99 ? 'other' : null;
    const age = Math.round(
      clamp(type === 'type1' ? normal(rand, 42, 17) : normal(rand, 66, 13), 12, 99),
    );
    const birthYear = QUARTER.year - age;
    const s = rand();
    const sex = s < 0.45 ? 'F' : s < 0.99 ? 'M' : s < 0.995 ? 'X' : 'U';
    const diagnosisYear =
      rand() < 0.03
        ? null
        : Math.min(QUARTER.year, birthYear + Math.max(1, Math.round(age * (0.3 + rand() * 0.65))));
    const deprivation = rand() < 0.02 ? null : 1 + Math.floor(rand() * 5);
    const hba1cMonth = inWindow(RECORDED.hba1c);
    const bpMonth = inWindow(RECORDED.bp);
    const cholMonth = inWindow(RECORDED.cholesterol);
    const creatMonth = inWindow(RECORDED.creatinine);
    const acrMonth = inWindow(RECORDED.acr);
    const footMonth = inWindow(RECORDED.foot);
    const bmiMonth = inWindow(RECORDED.bmi);
    const smokingMonth = inWindow(RECORDED.smoking);
    const retinalMonth = inWindow(RECORDED.retinal);
    const systolic = Math.round(clamp(normal(rand, 134, 15), 85, 220));
    const diastolic = Math.round(clamp(normal(rand, 78, 10), 45, systolic - 15));
    const onInsulin =
      type === 'type1' ? (rand() < 0.98 ? 1 : 0) : rand() < 0.05 ? null : rand() < 0.2 ? 1 : 0;
    const statin = rand();
    const cvd = rand();
    const sm = rand();
    rows.push([
      submissionId,
      i + 2,
      ref,
      pseudonym(code, ref),
      birthYear,
      sex,
      type,
      diagnosisYear,
      deprivation,
      hba1cMonth,
      hba1cMonth && round1(clamp(normal(rand, 58 + control, 14), 28, 160)),
      bpMonth,
      bpMonth && systolic,
      bpMonth && diastolic,
      cholMonth,
      cholMonth && round1(clamp(normal(rand, 4.4, 1.0), 1.5, 11)),
      creatMonth,
      creatMonth && Math.round(clamp(normal(rand, 86, 26), 35, 600)),
      acrMonth,
      acrMonth && round1(clamp(Math.exp(normal(rand, 0.4, 1.1)), 0.1, 300)),
      footMonth,
      bmiMonth,
      bmiMonth && round1(clamp(normal(rand, 31, 6), 16, 65)),
      smokingMonth,
      smokingMonth && (sm < 0.15 ? 'current' : sm < 0.55 ? 'ex' : 'never'),
      retinalMonth,
      statin < 0.1 ? null : statin < 0.75 ? 1 : 0,
      onInsulin,
      onInsulin === 1 && diagnosisYear !== null
        ? Math.min(QUARTER.year, diagnosisYear + Math.floor(rand() * 8))
        : null,
      cvd < 0.05 ? null : cvd < 0.3 ? 1 : 0,
      null,
      null,
    ]);
  }
  return rows;
}

// ── generation and reuse ───────────────────────────────────────────────────

interface Marker {
  version: number;
  seed: number;
  practices: number;
  records: number;
}

async function marker(db: Sequelize, v: Variant): Promise<Marker | null> {
  const rows = await db.query<{ detail: string | Marker }>(
    "SELECT detail FROM audit_events WHERE action = 'bench.data_generated' ORDER BY id DESC LIMIT 1",
    { type: QueryTypes.SELECT },
  );
  const detail = rows[0]?.detail;
  if (!detail) return null;
  const m = typeof detail === 'string' ? (JSON.parse(detail) as Marker) : detail;
  return m.version === GENERATOR_VERSION &&
    m.seed === SEED &&
    m.practices === v.practices &&
    m.records === records(v)
    ? m
    : null;
}

export interface BenchData {
  variant: Variant;
  db: Sequelize;
  quarterId: number;
  /** Seconds the generation took, or null when the data was reused */
  generatedSeconds: number | null;
}

/** The variant's data: found complete and reused, or generated now. */
export async function ensureBenchData(
  config: CairnConfig,
  secrets: CairnSecrets,
  v: Variant,
  log: (line: string) => void = console.log,
): Promise<BenchData> {
  const named: CairnConfig = { ...config, database: { ...config.database, name: v.database } };
  await createDatabase(named, secrets);
  let db = connect(named, secrets);
  await migrateUp(db);
  if (await marker(db, v)) {
    return { variant: v, db, quarterId: await quarterOf(db, v), generatedSeconds: null };
  }
  // Nothing usable: start from an empty database (an interrupted run leaves a partial one).
  await db.close();
  await dropTestDatabase(named, secrets);
  await createDatabase(named, secrets);
  db = connect(named, secrets);
  await migrateUp(db);
  const t0 = performance.now();
  await generate(db, v, log);
  const generatedSeconds = (performance.now() - t0) / 1000;
  return { variant: v, db, quarterId: await quarterOf(db, v), generatedSeconds };
}

async function quarterOf(db: Sequelize, v: Variant): Promise<number> {
  const [row] = await db.query<{ id: number }>(
    `SELECT q.id FROM audit_quarters q JOIN regions r ON r.id = q.region_id
      WHERE r.code = ? AND q.year = ? AND q.quarter = ?`,
    { replacements: [v.regionCode, QUARTER.year, QUARTER.quarter], type: QueryTypes.SELECT },
  );
  if (!row) throw new Error(`the ${v.name} benchmark data has no audit quarter`);
  return Number(row.id);
}

async function generate(db: Sequelize, v: Variant, log: (line: string) => void): Promise<void> {
  const insert = (sql: string, replacements: unknown[]) =>
    db.query(sql, { replacements, type: QueryTypes.INSERT });
  const [regionId] = await insert('INSERT INTO regions (code, name) VALUES (?, ?)', [
    v.regionCode,
    `Benchmark ${v.name} (invented)`,
  ]);
  for (let l = 1; l <= v.localities; l++) {
    await insert('INSERT INTO localities (region_id, code, name) VALUES (?, ?, ?)', [
      regionId,
      `${v.prefix}L${String(l).padStart(2, '0')}`,
      `Benchmark locality ${l}`,
    ]);
  }
  const localities = await db.query<{ id: number }>(
    'SELECT id FROM localities WHERE region_id = ? ORDER BY code',
    { replacements: [regionId], type: QueryTypes.SELECT },
  );
  const codes = Array.from(
    { length: v.practices },
    (_, p) => `${v.prefix}${String(p + 1).padStart(5, '0')}`,
  );
  const sizes = practiceSizes(v);
  for (let from = 0; from < v.practices; from += 1000) {
    const chunk = codes.slice(from, from + 1000);
    await insert(
      `INSERT INTO practices (region_id, locality_id, code, name, list_size) VALUES ${chunk.map(() => '(?, ?, ?, ?, ?)').join(', ')}`,
      chunk.flatMap((code, k) => [
        regionId,
        localities[(from + k) % localities.length]!.id,
        code,
        `Benchmark practice ${code}`,
        sizes[from + k]! * 14,
      ]),
    );
  }
  const [quarterId] = await insert(
    `INSERT INTO audit_quarters (region_id, year, quarter, window_start, window_end, measure_set_id,
       submission_deadline, status, opened_at, closed_at)
     VALUES (?, ?, ?, ?, ?, ?, '2026-12-16', 'closed', NOW(3), NOW(3))`,
    [
      regionId,
      QUARTER.year,
      QUARTER.quarter,
      monthText(WINDOW_START),
      monthText(WINDOW_START + 11),
      MEASURE_SET,
    ],
  );
  const practices = await db.query<{ id: number; code: string }>(
    'SELECT id, code FROM practices WHERE region_id = ? ORDER BY code',
    { replacements: [regionId], type: QueryTypes.SELECT },
  );
  for (let from = 0; from < practices.length; from += 1000) {
    const chunk = practices.slice(from, from + 1000);
    await insert(
      `INSERT INTO submissions (practice_id, quarter_id, status, file_name, file_size_bytes, file_kind,
         uploaded_by_label, uploaded_at, processed_at, confirmed_at, confirmed_by_label,
         rows_total, rows_done, rows_read, rows_accepted, rows_rejected, rows_blank,
         error_count, warning_count, flag_count, file_deleted_at)
       VALUES ${chunk.map(() => "(?, ?, 'accepted', ?, 0, 'csv', 'benchmark', NOW(3), NOW(3), NOW(3), 'benchmark', ?, ?, ?, ?, 0, 0, 0, 0, 0, NOW(3))").join(', ')}`,
      chunk.flatMap((p, k) => {
        const n = sizes[from + k]!;
        return [p.id, quarterId, `${p.code}-2026Q3.csv`, n, n, n, n];
      }),
    );
  }
  const submissions = await db.query<{ id: number; practice_id: number }>(
    'SELECT id, practice_id FROM submissions WHERE quarter_id = ? ORDER BY practice_id',
    { replacements: [quarterId], type: QueryTypes.SELECT },
  );
  const submissionOf = new Map(submissions.map((s) => [Number(s.practice_id), Number(s.id)]));
  for (let from = 0; from < practices.length; from += 1000) {
    const chunk = practices.slice(from, from + 1000);
    await insert(
      `INSERT INTO practice_quarters (practice_id, quarter_id, current_submission_id, switched_at)
       VALUES ${chunk.map(() => '(?, ?, ?, NOW(3))').join(', ')}`,
      chunk.flatMap((p) => [p.id, quarterId, submissionOf.get(Number(p.id))]),
    );
  }

  // Care records: LOAD DATA statements of about STATEMENT_ROWS rows, whole practices each; the
  // next one is generated and encoded while MariaDB stores the one before.
  const key = Buffer.from(BENCH_SECRET, 'utf8');
  const pseudonym = (code: string, ref: string) =>
    createHmac('sha256', key)
      .update(pseudonymMessage(code, ref), 'utf8')
      .digest('hex')
      .slice(0, PSEUDONYM_LENGTH);
  const raw = await acquireRaw(db);
  let loaded = 0;
  let lastLog = performance.now();
  try {
    await raw.query('SET foreign_key_checks = 0, unique_checks = 0');
    let pending: Promise<void> | null = null;
    let p = 0;
    while (p < practices.length) {
      const chunks: Buffer[] = [];
      const encoder = new TsvEncoder((chunk) => chunks.push(chunk));
      let rows = 0;
      while (p < practices.length && rows < STATEMENT_ROWS) {
        const practice = practices[p]!;
        const generated = practiceRows(
          p,
          practice.code,
          sizes[p]!,
          submissionOf.get(Number(practice.id))!,
          pseudonym,
        );
        if (generated[0] && generated[0].length !== RECORD_COLUMNS.length)
          throw new Error(
            `a generated row has ${generated[0].length} of ${RECORD_COLUMNS.length} columns`,
          );
        for (const row of generated) encoder.line(row);
        rows += generated.length;
        p++;
      }
      encoder.flush();
      if (pending) await pending;
      pending = raw
        .query<{ affectedRows: number }>({
          sql: LOAD_RECORDS_SQL,
          infileStreamFactory: () => Readable.from(chunks),
        })
        .then((result) => {
          if (result.affectedRows !== rows)
            throw new Error(`LOAD DATA stored ${result.affectedRows} of ${rows} rows`);
          loaded += rows;
          if (performance.now() - lastLog > 15_000) {
            lastLog = performance.now();
            log(`      … ${loaded.toLocaleString('en-GB')} records loaded`);
          }
        });
      // An early failure is raised by the await above or the one below, not left unhandled.
      pending.catch(() => undefined);
    }
    if (pending) await pending;
  } finally {
    await raw.query('SET foreign_key_checks = 1, unique_checks = 1').catch(() => undefined);
    await releaseRaw(db, raw);
  }
  if (loaded !== records(v)) throw new Error(`loaded ${loaded} records, expected ${records(v)}`);
  await db.query('ANALYZE TABLE care_records', { type: QueryTypes.SELECT });
  const detail: Marker = {
    version: GENERATOR_VERSION,
    seed: SEED,
    practices: v.practices,
    records: loaded,
  };
  await insert(
    `INSERT INTO audit_events (occurred_at, action, actor_label, region_id, summary, detail)
     VALUES (NOW(3), 'bench.data_generated', 'benchmark', ?, ?, ?)`,
    [
      regionId,
      `Benchmark ${v.name} data generated: ${v.practices} practices, ${loaded} care records`,
      JSON.stringify(detail),
    ],
  );
}

// ── the reads ──────────────────────────────────────────────────────────────

/** The columns the metrics read, per record (practice identity, then FlatCareRecord's fields). */
export const METRIC_COLUMNS = CARE_COLUMNS;

const MONTH_COLUMNS = METRIC_COLUMNS.filter((c) => c.endsWith('_month'));
const monthPositions = METRIC_COLUMNS.map((c, i) => (c.endsWith('_month') ? i + 1 : -1)).filter(
  (i) => i >= 0,
);

function selectSql(monthsAsIndices: boolean): string {
  const columns = METRIC_COLUMNS.map((c) =>
    monthsAsIndices && (MONTH_COLUMNS as readonly string[]).includes(c)
      ? `CAST(SUBSTRING(r.${c}, 1, 4) AS UNSIGNED) * 12 + CAST(SUBSTRING(r.${c}, 6, 2) AS UNSIGNED) - 1 AS ${c}`
      : `r.${c}`,
  );
  return `SELECT pq.practice_id, ${columns.join(', ')}
            FROM practice_quarters pq
            JOIN care_records r ON r.submission_id = pq.current_submission_id
           WHERE pq.quarter_id = ?`;
}

/** Every column read and summarised inside MariaDB, nothing sent: the server's own share. */
async function serverOnly(data: BenchData): Promise<ReadResult> {
  const t0 = performance.now();
  const [row] = await data.db.query<{ n: number }>(
    `SELECT COUNT(*) AS n, SUM(LENGTH(CONCAT_WS(',', ${METRIC_COLUMNS.map((c) => `r.${c}`).join(', ')}))) AS chars
       FROM practice_quarters pq
       JOIN care_records r ON r.submission_id = pq.current_submission_id
      WHERE pq.quarter_id = ?`,
    { replacements: [data.quarterId], type: QueryTypes.SELECT },
  );
  return {
    label: 'in MariaDB only, nothing sent',
    rows: Number(row?.n ?? 0),
    seconds: (performance.now() - t0) / 1000,
  };
}

export interface ReadResult {
  label: string;
  rows: number;
  seconds: number;
}

async function streamRead(
  config: CairnConfig,
  secrets: CairnSecrets,
  v: Variant,
  quarterId: number,
  label: string,
  monthsAsIndices: boolean,
  onRow: ((row: unknown[]) => void) | null,
): Promise<ReadResult> {
  const connection = await mariadb.createConnection({
    host: config.database.host,
    port: config.database.port,
    user: config.database.user,
    password: secrets.CAIRN_DATABASE_PASSWORD,
    database: v.database,
    bigIntAsNumber: true,
    decimalAsNumber: true,
  });
  try {
    const t0 = performance.now();
    let rows = 0;
    // 'data' events, not `for await`: the async iterator cost about 40 % more here.
    await new Promise<void>((resolve, reject) => {
      const stream = connection.queryStream(
        { sql: selectSql(monthsAsIndices), rowsAsArray: true },
        [quarterId],
      );
      stream.on('data', (row: unknown[]) => {
        rows++;
        if (onRow) onRow(row);
      });
      stream.on('end', () => resolve());
      stream.on('error', reject);
    });
    return { label, rows, seconds: (performance.now() - t0) / 1000 };
  } finally {
    await connection.end();
  }
}

/** The reference read alone (months as strings, nothing done with the rows): seconds and rows. */
export function referenceRead(
  config: CairnConfig,
  secrets: CairnSecrets,
  data: BenchData,
): Promise<ReadResult> {
  return streamRead(
    config,
    secrets,
    data.variant,
    data.quarterId,
    'months as strings (reference)',
    false,
    null,
  );
}

/** The three reads, each after an untimed warm-up read of the same rows. */
/** Runs of each read; every run's time is printed beside the median (this machine is noisy). */
export const READ_RUNS = 3;

export interface ReadFigures {
  label: string;
  rows: number;
  /** Median of the runs */
  seconds: number;
  runs: number[];
}

/**
 * The reads, interleaved run by run (so that a slow minute of this shared machine spreads over
 * all of them), after one untimed read of the same rows.
 */
export async function measureReads(
  config: CairnConfig,
  secrets: CairnSecrets,
  data: BenchData,
  runs = READ_RUNS,
): Promise<ReadFigures[]> {
  const { variant: v, quarterId } = data;
  let sink = 0;
  const parse = (row: unknown[]) => {
    for (const i of monthPositions) {
      const month = row[i];
      if (month !== null) sink += monthIndex(month as string);
    }
  };
  const reads: (() => Promise<ReadResult>)[] = [
    () => streamRead(config, secrets, v, quarterId, 'months as strings (reference)', false, null),
    () =>
      streamRead(config, secrets, v, quarterId, 'months parsed in JS (monthIndex)', false, parse),
    () => streamRead(config, secrets, v, quarterId, 'months as indices from MariaDB', true, null),
    () => serverOnly(data),
  ];
  await streamRead(config, secrets, v, quarterId, 'warm-up', false, null);
  const results: ReadResult[][] = reads.map(() => []);
  for (let run = 0; run < runs; run++) {
    for (const [i, read] of reads.entries()) results[i]!.push(await read());
  }
  if (sink === 0) throw new Error('no month was parsed');
  return results.map((list) => {
    for (const r of list) {
      if (r.rows !== records(v))
        throw new Error(`${r.label}: read ${r.rows} of ${records(v)} rows`);
    }
    const times = list.map((r) => r.seconds);
    return {
      label: list[0]!.label,
      rows: list[0]!.rows,
      seconds: [...times].sort((a, b) => a - b)[times.length >> 1]!,
      runs: times,
    };
  });
}

const fmt = (n: number) => new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 }).format(n);

/** The section of `npm run bench`: both variants, generated or reused, then the reads. */
export async function runNationalBench(
  options: { variants?: Variant['name'][]; log?: (line: string) => void } = {},
): Promise<void> {
  const log = options.log ?? console.log;
  const config = loadConfig({ profile: 'test' });
  const secrets = loadSecrets();
  for (const name of options.variants ?? ['region', 'national']) {
    const v = VARIANTS[name];
    log(
      `  ${v.name}: ${fmt(v.practices)} practices, ${fmt(records(v))} care records (${v.database})`,
    );
    const data = await ensureBenchData(config, secrets, v, log);
    try {
      log(
        data.generatedSeconds === null
          ? '    data: reused (generated by an earlier run)'
          : `    data: generated in ${data.generatedSeconds.toFixed(1)} s (${fmt(records(v) / data.generatedSeconds)} records/s, LOAD DATA included)`,
      );
      const figures = await measureReads(config, secrets, data);
      const reference = figures[0]!.seconds;
      log(
        `    reads of every current record of ${QUARTER.year} Q${QUARTER.quarter}, median of ${READ_RUNS} runs:`,
      );
      for (const r of figures) {
        log(
          `    SELECT, ${r.label.padEnd(34)} ${r.seconds.toFixed(2).padStart(6)} s  ${fmt(r.rows / r.seconds).padStart(10)} rows/s   × ${(r.seconds / reference).toFixed(2)}   (runs: ${r.runs.map((x) => x.toFixed(2)).join(', ')} s)`,
        );
      }
    } finally {
      await data.db.close();
    }
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  // Run alone: the test profile, and the test secrets left by `npm run db:start -- --profile test`.
  process.env.CAIRN_PROFILE = 'test';
  const file = join(findRepoRoot(), '.data', 'secrets-test.json');
  if (!process.env.CAIRN_DATABASE_PASSWORD && existsSync(file)) {
    const stored = JSON.parse(readFileSync(file, 'utf8')) as Record<string, string>;
    for (const [name, value] of Object.entries(stored)) process.env[name] ??= value;
  }
  await runNationalBench({
    variants: process.argv.includes('--region-only') ? ['region'] : undefined,
  });
}
