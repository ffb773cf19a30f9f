/**
 * The de-identified records behind one practice × measure: the records of the
 * practice's current submission that are in the measure's denominator (for the
 * type split), evaluated under the quarter's measure set, each shown under its
 * pseudonym only (docs/methods.md §9) — never the practice's own reference.
 * Which extract rows are in the denominator depends only on the submission,
 * the measure-set version and the measure (none of which ever change), so the
 * rows are kept in memory (bounded) by those keys; any process can rebuild them.
 */
import { evaluateRecord, reviewWindow, type TypeSplit } from '@cairn/metrics';
import type { MeasureView } from '../../measure-sets/describe.js';
import type { MeasureSetVersion } from '../../measure-sets/measure-sets.service.js';
import { inDenominator } from '../../benchmarks/recall/recall-rule.js';
import { readingOf } from '../../benchmarks/recall/readings.js';
import type { SubmissionsService } from '../../submissions/submissions.service.js';

export interface DrillRecord {
  pseudonym: string;
  birthYear: number;
  age: number;
  sex: string;
  diabetesType: string;
  deprivationQuintile: number | null;
  outcome: 'met' | 'not_met' | 'unknown';
  readings: string;
}

const OUTCOME_WORDS = { met: 'met', not_met: 'not met', unknown: 'not recorded' } as const;
export const outcomeWords = (o: DrillRecord['outcome']) => OUTCOME_WORDS[o];

const CACHE_ROWS = 2_000_000;

export class DrillRecords {
  private readonly rows = new Map<string, Uint32Array>();
  private held = 0;

  constructor(private readonly submissions: SubmissionsService) {}

  /** The extract rows in the measure's denominator, ascending. */
  async rowsOf(
    submission: { id: number; practiceCode: string },
    version: MeasureSetVersion,
    measure: MeasureView,
    split: TypeSplit,
    at: { year: 1 | number; quarter: 1 | 2 | 3 | 4 },
  ): Promise<Uint32Array> {
    const key = `${submission.id}/${version.id}/${measure.key}/${split}`;
    const known = this.rows.get(key);
    if (known) return known;
    const found: number[] = [];
    for await (const batch of this.submissions.records(submission)) {
      for (const s of batch) {
        const o = evaluateRecord(s.record, version.compiled, at);
        if (!o.eligible) continue;
        if (split !== 'all' && o.typeGroup !== split) continue;
        if (inDenominator(measure, o.outcomes[measure.key])) found.push(s.row);
      }
    }
    const rows = Uint32Array.from(found);
    if (this.held + rows.length > CACHE_ROWS) {
      this.rows.clear();
      this.held = 0;
    }
    this.rows.set(key, rows);
    this.held += rows.length;
    return rows;
  }

  /** Some of those rows, described (pseudonyms only). */
  async describe(
    submission: { id: number; practiceCode: string },
    version: MeasureSetVersion,
    measure: MeasureView,
    rows: readonly number[],
    at: { year: number; quarter: 1 | 2 | 3 | 4 },
  ): Promise<DrillRecord[]> {
    const window = reviewWindow(at, version.compiled.retinalWindowMonths);
    const stored = await this.submissions.recordsAt(submission, rows);
    return stored.map((s) => {
      const o = evaluateRecord(s.record, version.compiled, at);
      const outcome = o.outcomes[measure.key];
      return {
        pseudonym: s.pseudonym,
        birthYear: s.record.birthYear,
        age: o.age,
        sex: s.record.sex,
        diabetesType: s.record.diabetesType ?? 'unknown',
        deprivationQuintile: s.record.deprivationQuintile,
        outcome: outcome === 'met' || outcome === 'not_met' ? outcome : 'unknown',
        readings: measure.reads
          .map((read) => readingOf(s.record, read, window))
          .map((r) => `${r.label}: ${r.value ?? 'none'}${r.month ? ` (${r.month})` : ''}`)
          .join('; '),
      };
    });
  }
}
