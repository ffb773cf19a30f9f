/**
 * The incremental path and the full recompute from records make the same stored result, byte
 * for byte, for any records (a property test, fast-check):
 *
 * - incremental: each submission's sums made from its own records at confirm
 *   (`SubmissionSums.forConfirm`), stored, read back by another process (`ofCurrent`), and the
 *   benchmark built from them;
 * - full recompute: every current record of the quarter in one streamed read, rows of all
 *   practices interleaved in any order (`recomputeQuarter`);
 * - fill: every submission's sums missing at once, as after a measure-set change (`ofCurrent`
 *   reading them in one streamed read).
 *
 * - rebuild after a confirm: a random sequence of confirms (practices joining, submissions
 *   replaced), each new set's result rebuilt from the previous result's parts and the sums of
 *   the submissions that left and joined (`rebuildContent`), equal to a build from scratch.
 *
 * The rows reach the code as the connector hands them over (arrays of the submission id and the
 * text SUMS_SELECT asks MariaDB for, no type cast), from an in-memory stand-in for the repository's four reads and writes; the
 * database paths themselves are checked in test/benchmarks.e2e-spec.ts.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { findRepoRoot } from '../../config/load-config.js';
import { decodeMeasureSet, MEASURE_SET_FOLDER } from '../../measure-sets/measure-sets.service.js';
import type { RecordScope, SubmissionRepository, SumsRow } from '../submission.repository.js';
import { SubmissionSums, type SumsSubject } from './submission-sums.js';
import { SUMS_COLUMNS } from './sums-rows.js';
import { resultContent } from '../../benchmarks/benchmark-store.service.js';
import { encodeResult } from '../../benchmarks/results/result-body.js';
import {
  partsOfBuild,
  rebuildContent,
  type ResultParts,
  setChange,
  type SetMember,
} from '../../benchmarks/results/rebuild.js';

const version = decodeMeasureSet(
  'cairn-default-2026.1.json',
  readFileSync(join(findRepoRoot(), MEASURE_SET_FOLDER, 'cairn-default-2026.1.json'), 'utf8'),
);
const quarter = { id: 11, year: 2026, quarter: 3 as const };

const month = fc
  .record({ year: fc.integer({ min: 2024, max: 2026 }), month: fc.integer({ min: 1, max: 12 }) })
  .map(({ year, month }) => `${year}-${String(month).padStart(2, '0')}`);
const maybe = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: null, freq: 4 });
const decimal = (min: number, max: number) =>
  fc.integer({ min: min * 10, max: max * 10 }).map((v) => v / 10);
const flag = maybe(fc.constantFrom(0, 1));

/** One care record as the connector gives it: values by SUMS_COLUMNS name. */
const record = fc.record({
  birth_year: fc.integer({ min: 1925, max: 2020 }),
  sex: fc.constantFrom('F', 'M', 'X', 'U'),
  diabetes_type: maybe(fc.constantFrom('type1', 'type2', 'other')),
  diagnosis_year: maybe(fc.integer({ min: 1975, max: 2026 })),
  deprivation_quintile: maybe(fc.integer({ min: 1, max: 5 })),
  hba1c_month: maybe(month),
  hba1c_mmol_mol: maybe(fc.integer({ min: 25, max: 140 })),
  blood_pressure_month: maybe(month),
  systolic: maybe(fc.integer({ min: 85, max: 210 })),
  diastolic: maybe(fc.integer({ min: 45, max: 125 })),
  cholesterol_month: maybe(month),
  total_cholesterol_mmol_l: maybe(decimal(2, 9)),
  serum_creatinine_month: maybe(month),
  serum_creatinine_umol_l: maybe(fc.integer({ min: 35, max: 600 })),
  urine_albumin_month: maybe(month),
  acr_mg_mmol: maybe(decimal(0, 80)),
  foot_surveillance_month: maybe(month),
  bmi_month: maybe(month),
  bmi_kg_m2: maybe(decimal(16, 55)),
  smoking_month: maybe(month),
  smoking_status: maybe(fc.constantFrom('current', 'ex', 'never')),
  retinal_screening_month: maybe(month),
  on_statin: flag,
  on_insulin: flag,
  insulin_start_year: maybe(fc.integer({ min: 1985, max: 2026 })),
  cvd_history: flag,
});

const world = fc.record({
  practices: fc.array(fc.array(record, { minLength: 1, maxLength: 30 }), {
    minLength: 1,
    maxLength: 7,
  }),
  /** Sort keys that interleave the quarter's rows in the full recompute's read */
  order: fc.array(fc.double({ noNaN: true }), { minLength: 220, maxLength: 220 }),
});

type Row = unknown[];

/**
 * A stored value as the sums read's SELECT writes it in its text (sums-rows.ts, `SUMS_SELECT`):
 * '' for NULL, months as stored, sex as 1…4, diabetes type and smoking status as 1…3 or 0 for
 * NULL, numbers as written.
 */
function asSent(column: string, value: unknown): string {
  if (value === null) {
    return column === 'diabetes_type' || column === 'smoking_status' ? '0' : '';
  }
  if (column === 'sex') return String(['F', 'M', 'X', 'U'].indexOf(String(value)) + 1);
  if (column === 'diabetes_type') {
    return String(['type1', 'type2', 'other'].indexOf(String(value)) + 1);
  }
  if (column === 'smoking_status') {
    return String(['current', 'ex', 'never'].indexOf(String(value)) + 1);
  }
  return String(value);
}

/** A record as the sums read sends it: [submission id, its text]. */
const sent = (submissionId: number, r: Record<string, unknown>): Row => [
  submissionId,
  SUMS_COLUMNS.map((c) => asSent(c, r[c])).join(','),
];

/** The repository's reads and writes of records and sums, in memory. */
function memoryRepository(
  rowsOf: ReadonlyMap<number, Row[]>,
  quarterRows: Row[],
  stored: SumsRow[] = [],
): { repository: SubmissionRepository; written: SumsRow[] } {
  const written: SumsRow[] = [];
  const repository = {
    streamSumsRows: async (scope: RecordScope, onRow: (row: Row) => void) => {
      const rows =
        'quarterId' in scope
          ? quarterRows
          : 'submissionId' in scope
            ? (rowsOf.get(scope.submissionId) ?? [])
            : scope.submissionIds.flatMap((id) => rowsOf.get(id) ?? []);
      for (const row of rows) onRow([...row]);
      return rows.length;
    },
    sums: async (ids: readonly number[], measureSetId: string) =>
      stored.filter((r) => ids.includes(r.submission_id) && r.measure_set_id === measureSetId),
    replaceSums: async (rows: readonly SumsRow[]) => {
      written.push(...rows);
    },
    currentRecordCount: async () => quarterRows.length,
  };
  return { repository: repository as unknown as SubmissionRepository, written };
}

const hex = (rows: readonly SumsRow[]) =>
  rows
    .map((r) => [r.submission_id, r.records, r.bytes.toString('hex')] as const)
    .sort((a, b) => a[0] - b[0]);

describe('the incremental path and the full recompute from records', () => {
  it('store the same result, byte for byte, for any records', async () => {
    await fc.assert(
      fc.asyncProperty(world, async ({ practices, order }) => {
        const subjects: (SumsSubject & {
          practice: { code: string; localityCode: string | null };
        })[] = practices.map((records, p) => ({
          submissionId: 500 + p * 7,
          practiceCode: `P${String(p + 1).padStart(2, '0')}`,
          records: records.length,
          practice: {
            code: `P${String(p + 1).padStart(2, '0')}`,
            localityCode: p % 3 === 2 ? null : `L${p % 3}`,
          },
        }));
        const rowsOf = new Map<number, Row[]>(
          practices.map((records, p) => [
            subjects[p]!.submissionId,
            records.map((r) => sent(subjects[p]!.submissionId, r)),
          ]),
        );
        const all = [...rowsOf.values()].flat();
        const quarterRows = all
          .map((row, i) => ({ row, key: order[i % order.length]! + i * 1e-9 }))
          .sort((a, b) => a.key - b.key)
          .map((x) => x.row);

        // Incremental: sums at each confirm, stored; then read by a process with nothing in memory.
        const atConfirm = new SubmissionSums(memoryRepository(rowsOf, quarterRows).repository);
        const stored: SumsRow[] = [];
        for (const s of subjects) stored.push(await atConfirm.forConfirm(s, version, quarter));
        const reader = memoryRepository(rowsOf, quarterRows, stored);
        const incremental = await new SubmissionSums(reader.repository).ofCurrent(
          subjects,
          version,
          quarter,
        );
        expect(reader.written).toEqual([]);
        const body = encodeResult(resultContent(quarter, version, subjects, incremental));

        // Full recompute: the quarter's rows in one read, interleaved.
        const full = memoryRepository(rowsOf, quarterRows);
        const recomputed = await new SubmissionSums(full.repository).recomputeQuarter(
          quarter.id,
          subjects,
          version,
          quarter,
        );
        expect(hex(full.written)).toEqual(hex(stored));
        expect(
          encodeResult(resultContent(quarter, version, subjects, recomputed)).equals(body),
        ).toBe(true);

        // Every sum missing at once (a measure-set change): filled in one read, the same bytes.
        const empty = memoryRepository(rowsOf, quarterRows);
        const filled = await new SubmissionSums(empty.repository).ofCurrent(
          subjects,
          version,
          quarter,
        );
        expect(hex(empty.written)).toEqual(hex(stored));
        expect(encodeResult(resultContent(quarter, version, subjects, filled)).equals(body)).toBe(
          true,
        );
      }),
      { numRuns: 60 },
    );
  });

  it('rebuild each set after a confirm from the previous result, the bytes of a build from scratch', async () => {
    const sequence = fc.record({
      /** Practices' first submissions (null: the practice joins later, or never) */
      initial: fc.array(
        fc.option(fc.array(record, { minLength: 1, maxLength: 12 }), { nil: null }),
        {
          minLength: 1,
          maxLength: 6,
        },
      ),
      confirms: fc.array(
        fc.record({ slot: fc.nat(), records: fc.array(record, { minLength: 1, maxLength: 12 }) }),
        { minLength: 1, maxLength: 6 },
      ),
    });
    await fc.assert(
      fc.asyncProperty(sequence, async ({ initial, confirms }) => {
        const slots = initial.length;
        const practiceOf = (slot: number) => ({
          code: `P${String(slot + 1).padStart(2, '0')}`,
          localityCode: slot % 3 === 2 ? null : `L${slot % 3}`,
        });
        const rowsOf = new Map<number, Row[]>();
        const stored: SumsRow[] = [];
        const current = new Map<number, number>();
        let nextId = 900;
        /** A submission staged from these records and confirmed: its sums stored. */
        const confirm = async (slot: number, records: (typeof initial)[number] & object) => {
          const id = nextId++;
          rowsOf.set(
            id,
            records.map((r) => sent(id, r)),
          );
          const atConfirm = new SubmissionSums(memoryRepository(rowsOf, []).repository);
          stored.push(
            await atConfirm.forConfirm(
              { submissionId: id, practiceCode: practiceOf(slot).code, records: records.length },
              version,
              quarter,
            ),
          );
          current.set(slot, id);
        };
        const members = (): (SetMember & SumsSubject)[] =>
          [...current]
            .sort((a, b) => a[0] - b[0])
            .map(([slot, id]) => ({
              submissionId: id,
              practiceCode: practiceOf(slot).code,
              records: 0,
              practice: practiceOf(slot),
            }));
        /** Sums read back by another process (stored bytes, nothing in memory). */
        const read = (subjects: SumsSubject[]) =>
          new SubmissionSums(memoryRepository(rowsOf, [], stored).repository).ofCurrent(
            subjects,
            version,
            quarter,
          );
        for (let slot = 0; slot < slots; slot++) {
          const records = initial[slot];
          if (records) await confirm(slot, records);
        }
        let parts: ResultParts | null = null;
        if (current.size > 0) {
          const now = members();
          const sums = await read(now);
          const content = resultContent(quarter, version, now, sums);
          parts = partsOfBuild(quarter.id, version, now, sums, content.regionSums);
        }
        for (const step of confirms) {
          const slot = step.slot % slots;
          const replaced = current.get(slot) ?? null;
          await confirm(slot, step.records);
          const now = members();
          const scratch = encodeResult(resultContent(quarter, version, now, await read(now)));
          if (parts === null) {
            const sums = await read(now);
            const content = resultContent(quarter, version, now, sums);
            parts = partsOfBuild(quarter.id, version, now, sums, content.regionSums);
            continue;
          }
          const change = setChange(parts, now);
          expect(change.left).toEqual(replaced === null ? [] : [replaced]);
          expect(change.joined).toEqual([current.get(slot)]);
          const changed = await read(
            [...change.left, ...change.joined].map((id) => ({
              submissionId: id,
              practiceCode: practiceOf(slot).code,
              records: 0,
            })),
          );
          const rebuilt = rebuildContent(quarter, version, parts, now, changed);
          expect(encodeResult(rebuilt.content).equals(scratch)).toBe(true);
          parts = rebuilt.parts;
        }
      }),
      { numRuns: 40 },
    );
  });
});

describe('the full recompute evaluated a chunk at a time as the rows stream', () => {
  it('stores what each submission makes alone, with rows grouped or interleaved', async () => {
    await fc.assert(
      fc.asyncProperty(
        world,
        fc.integer({ min: 1, max: 40 }),
        async ({ practices, order }, chunkRecords) => {
          const subjects: SumsSubject[] = practices.map((records, p) => ({
            submissionId: 900 - p * 3,
            practiceCode: `Q${String(p + 1).padStart(2, '0')}`,
            records: records.length,
          }));
          const rowsOf = new Map<number, Row[]>(
            practices.map((records, p) => [
              subjects[p]!.submissionId,
              records.map((r) => sent(subjects[p]!.submissionId, r)),
            ]),
          );
          const grouped = [...rowsOf.values()].flat();
          const interleaved = grouped
            .map((row, i) => ({ row, key: order[i % order.length]! + i * 1e-9 }))
            .sort((a, b) => a.key - b.key)
            .map((x) => x.row);

          const alone = new SubmissionSums(memoryRepository(rowsOf, grouped).repository);
          const stored: SumsRow[] = [];
          for (const s of subjects) stored.push(await alone.forConfirm(s, version, quarter));

          for (const quarterRows of [grouped, interleaved]) {
            const chunked = memoryRepository(rowsOf, quarterRows);
            const sums = await new SubmissionSums(
              chunked.repository,
              chunkRecords,
            ).recomputeQuarter(quarter.id, subjects, version, quarter);
            expect(hex(chunked.written)).toEqual(hex(stored));
            expect([...sums.keys()]).toEqual(subjects.map((s) => s.submissionId));
          }
        },
      ),
      { numRuns: 40 },
    );
  });
});
