/**
 * A submission's sums (@cairn/metrics practice sums, docs/methods.md §10):
 * every count a benchmark needs of one practice's records, computed once from
 * the submission's own stored records and kept in `submission_sums`, one row
 * per measure-set version.
 *
 * - At confirm: `forConfirm` computes them before the confirm transaction (the
 *   records never change once staged) and the transaction inserts them, so a
 *   current submission always has its sums under its quarter's measure set.
 * - On read: `ofCurrent` gives the decoded sums of a quarter's current
 *   submissions, from memory (decoded sums of a submission under a
 *   measure-set version never change, so any process may keep them), else
 *   from the table, else — missing (an older database, a measure-set change)
 *   or unreadable (another format, another layout) — computed again from the
 *   records by the same code and stored; several missing at once (a quarter
 *   whose measure set changed) are read in one streamed SELECT.
 * - A full recompute (`recomputeQuarter`): every current record of the quarter
 *   in one streamed read, the sums of every practice at once, all stored.
 *
 * The records are read as arrays straight from the connector (sums-rows.ts)
 * into the column builder; `sumsOfColumns` then makes the sums.
 */
import {
  type AuditQuarter,
  type ColumnBuilder,
  createColumnBuilder,
  decodeSums,
  encodeSums,
  type PracticeSums,
  SUMS_FORMAT_VERSION,
  sumsLayout,
  sumsOfColumns,
} from '@cairn/metrics';
import type { MeasureSetVersion } from '../../measure-sets/measure-sets.service.js';
import type { RecordScope, SubmissionRepository, SumsRow } from '../submission.repository.js';
import { rowAppender } from './sums-rows.js';

/** A current submission whose sums are wanted: its id, its practice's code, its records. */
export interface SumsSubject {
  submissionId: number;
  practiceCode: string;
  /** Records accepted (a capacity hint for the column builder) */
  records: number;
}

/** Bytes of decoded sums kept in memory at most (an estimate from their arrays). */
const CACHE_BYTES = 160 * 1024 * 1024;

function sizeOf(s: PracticeSums): number {
  return (
    s.cells.byteLength +
    s.eligible.byteLength +
    s.strata.ids.byteLength +
    s.strata.values.byteLength +
    s.insulin.counts.byteLength +
    s.values.byteLength +
    s.kidney.byteLength +
    s.tallies.byteLength +
    256
  );
}

/** Records a chunk of a full recompute holds before it is evaluated (whole submissions). */
export const CHUNK_RECORDS = 16_384;

export class SubmissionSums {
  private readonly cache = new Map<string, PracticeSums>();
  private cachedBytes = 0;

  constructor(
    private readonly repository: SubmissionRepository,
    private readonly chunkRecords = CHUNK_RECORDS,
  ) {}

  /**
   * The sums of every practice of `scope`'s records (one submission, or every current record
   * of a quarter), by practice code; `practices` are indexed first, so a practice without
   * records gets empty sums.
   */
  private async compute(
    scope: RecordScope,
    practiceOf: (submissionId: number) => string,
    practices: readonly string[],
    capacity: number,
    version: MeasureSetVersion,
    quarter: AuditQuarter,
  ): Promise<Map<string, PracticeSums>> {
    const builder = createColumnBuilder({
      capacity: Math.max(capacity, 16),
      practiceCodes: practices,
    });
    await this.repository.streamSumsRows(scope, rowAppender(builder, practiceOf));
    return sumsOfColumns(builder.finish(), sumsLayout(version.compiled), quarter);
  }

  private row(submissionId: number, version: MeasureSetVersion, sums: PracticeSums): SumsRow {
    return {
      submission_id: submissionId,
      measure_set_id: version.id,
      format_version: SUMS_FORMAT_VERSION,
      records: sums.records[0] as number,
      bytes: Buffer.from(encodeSums(sums)),
    };
  }

  /** One submission's sums from its own records, as the row the confirm transaction inserts. */
  async forConfirm(
    subject: SumsSubject,
    version: MeasureSetVersion,
    quarter: AuditQuarter,
  ): Promise<SumsRow> {
    const sums = await this.computeOne(subject, version, quarter);
    return this.row(subject.submissionId, version, sums);
  }

  private async computeOne(
    subject: SumsSubject,
    version: MeasureSetVersion,
    quarter: AuditQuarter,
  ): Promise<PracticeSums> {
    const all = await this.compute(
      { submissionId: subject.submissionId },
      () => subject.practiceCode,
      [subject.practiceCode],
      subject.records,
      version,
      quarter,
    );
    const sums = all.get(subject.practiceCode);
    if (!sums || all.size !== 1) {
      throw new Error(`the sums of submission ${subject.submissionId} are not one practice's`);
    }
    return sums;
  }

  /**
   * Decoded sums of these current submissions under `version`, by submission id: from memory,
   * from the table, or computed from the records (then stored) when missing or unreadable.
   */
  async ofCurrent(
    subjects: readonly SumsSubject[],
    version: MeasureSetVersion,
    quarter: AuditQuarter,
  ): Promise<Map<number, PracticeSums>> {
    const out = new Map<number, PracticeSums>();
    const wanted: SumsSubject[] = [];
    for (const s of subjects) {
      const cached = this.recall(s.submissionId, version.id);
      if (cached) out.set(s.submissionId, cached);
      else wanted.push(s);
    }
    if (wanted.length === 0) return out;
    const layout = sumsLayout(version.compiled);
    const stored = new Map(
      (
        await this.repository.sums(
          wanted.map((s) => s.submissionId),
          version.id,
        )
      ).map((r) => [Number(r.submission_id), r]),
    );
    const missing: SumsSubject[] = [];
    for (const s of wanted) {
      const row = stored.get(s.submissionId);
      let sums: PracticeSums | null = null;
      if (row && Number(row.format_version) === SUMS_FORMAT_VERSION) {
        try {
          sums = decodeSums(row.bytes, layout);
        } catch {
          // Another layout, damaged or truncated bytes: the records are the truth.
          sums = null;
        }
      }
      if (sums && !sameQuarter(sums.quarter, quarter)) sums = null;
      if (sums === null) missing.push(s);
      else {
        out.set(s.submissionId, sums);
        this.remember(s.submissionId, version.id, sums);
      }
    }
    const filled: SumsRow[] = [];
    const computed =
      missing.length === 1
        ? new Map([
            [missing[0]!.submissionId, await this.computeOne(missing[0]!, version, quarter)],
          ])
        : await this.computeMany(missing, version, quarter);
    for (const s of missing) {
      const sums = computed.get(s.submissionId)!;
      out.set(s.submissionId, sums);
      this.remember(s.submissionId, version.id, sums);
      filled.push(this.row(s.submissionId, version, sums));
    }
    await this.repository.replaceSums(filled);
    return out;
  }

  /**
   * The sums of several submissions from their records in one streamed read (many missing at
   * once: a measure-set change), by submission id. Practice codes are those of current
   * submissions of one quarter, so each appears once.
   */
  private async computeMany(
    subjects: readonly SumsSubject[],
    version: MeasureSetVersion,
    quarter: AuditQuarter,
  ): Promise<Map<number, PracticeSums>> {
    const codeOf = new Map(subjects.map((s) => [s.submissionId, s.practiceCode]));
    if (new Set(codeOf.values()).size !== subjects.length) {
      throw new Error('sums of several submissions of one practice cannot be read at once');
    }
    const byCode = await this.compute(
      { submissionIds: subjects.map((s) => s.submissionId) },
      (submissionId) => codeOf.get(submissionId)!,
      subjects.map((s) => s.practiceCode),
      subjects.reduce((n, s) => n + s.records, 0),
      version,
      quarter,
    );
    return new Map(subjects.map((s) => [s.submissionId, byCode.get(s.practiceCode)!]));
  }

  /**
   * A full recompute: every current record of the quarter in one streamed read, the sums of
   * each current submission, all stored (replacing what they had under this measure set).
   * Returns the sums by submission id.
   *
   * The records are evaluated as they stream, a chunk at a time: a chunk takes whole
   * submissions until it holds `chunkRecords` records, and its sums are made (and encoded) as
   * soon as the next submission's first row arrives, while MariaDB sends the rows after it. A
   * practice's sums depend only on its own records, so they equal those of one pass over every
   * record. The read sends each submission's rows together (the join follows care_records'
   * key); should a submission's rows come again after its chunk was evaluated, its sums are
   * made afterwards from its own records in one more read.
   */
  async recomputeQuarter(
    quarterId: number,
    subjects: readonly SumsSubject[],
    version: MeasureSetVersion,
    quarter: AuditQuarter,
  ): Promise<Map<number, PracticeSums>> {
    const codeOf = new Map(subjects.map((s) => [s.submissionId, s.practiceCode]));
    const practiceOf = (submissionId: number) => {
      const code = codeOf.get(submissionId);
      if (code === undefined) {
        throw new Error(`submission ${submissionId} became current during the recompute`);
      }
      return code;
    };
    const layout = sumsLayout(version.compiled);
    const out = new Map<number, PracticeSums>();
    const bytes = new Map<number, SumsRow>();
    /** Submissions of the chunk being built, and those already evaluated */
    let inChunk: number[] = [];
    const evaluated = new Set<number>();
    /** Submissions whose rows came again after their chunk was evaluated */
    const again = new Set<number>();
    // One builder for the whole read: after each chunk's sums it starts again on the same
    // arrays (the sums are the chunk's own arrays, so nothing reads the columns afterwards).
    const builder: ColumnBuilder = createColumnBuilder({ capacity: this.chunkRecords + 1024 });
    const append = rowAppender(builder, practiceOf);
    let current = -1;
    let skipping = false;
    const evaluate = () => {
      if (inChunk.length === 0) return;
      const byCode = sumsOfColumns(builder.finish(), layout, quarter);
      for (const id of inChunk) {
        const sums = byCode.get(codeOf.get(id)!);
        evaluated.add(id);
        if (!sums) continue;
        out.set(id, sums);
        bytes.set(id, this.row(id, version, sums));
      }
      builder.reset();
      inChunk = [];
    };
    await this.repository.streamSumsRows({ quarterId }, (row) => {
      const id = row[0] as number;
      if (id !== current) {
        current = id;
        skipping = evaluated.has(id);
        if (skipping) {
          again.add(id);
          return;
        }
        if (!inChunk.includes(id)) {
          // A new submission: the chunk is evaluated first when it is full.
          if (builder.length >= this.chunkRecords) evaluate();
          inChunk.push(id);
        }
      } else if (skipping) return;
      append(row);
    });
    evaluate();
    if (again.size > 0) {
      const split = subjects.filter((s) => again.has(s.submissionId));
      const computed = await this.computeMany(split, version, quarter);
      for (const s of split) {
        const sums = computed.get(s.submissionId)!;
        out.set(s.submissionId, sums);
        bytes.set(s.submissionId, this.row(s.submissionId, version, sums));
      }
    }
    const rows: SumsRow[] = [];
    for (const s of subjects) {
      let sums = out.get(s.submissionId);
      if (!sums) {
        // No record of this submission came in the quarter's read: its own read decides (an
        // error when it has none, as for one submission's sums).
        sums = await this.computeOne(s, version, quarter);
        out.set(s.submissionId, sums);
        bytes.set(s.submissionId, this.row(s.submissionId, version, sums));
      }
      this.remember(s.submissionId, version.id, sums);
      rows.push(bytes.get(s.submissionId)!);
    }
    await this.repository.replaceSums(rows);
    return new Map(subjects.map((s) => [s.submissionId, out.get(s.submissionId)!]));
  }

  private recall(submissionId: number, measureSetId: string): PracticeSums | undefined {
    const key = `${submissionId}/${measureSetId}`;
    const sums = this.cache.get(key);
    if (sums) {
      // Most recently used last.
      this.cache.delete(key);
      this.cache.set(key, sums);
    }
    return sums;
  }

  private remember(submissionId: number, measureSetId: string, sums: PracticeSums): void {
    const key = `${submissionId}/${measureSetId}`;
    const old = this.cache.get(key);
    if (old) {
      this.cache.delete(key);
      this.cachedBytes -= sizeOf(old);
    }
    this.cache.set(key, sums);
    this.cachedBytes += sizeOf(sums);
    for (const [oldest, s] of this.cache) {
      if (this.cachedBytes <= CACHE_BYTES || oldest === key) break;
      this.cache.delete(oldest);
      this.cachedBytes -= sizeOf(s);
    }
  }
}

function sameQuarter(a: AuditQuarter, b: AuditQuarter): boolean {
  return a.year === b.year && a.quarter === b.quarter;
}
