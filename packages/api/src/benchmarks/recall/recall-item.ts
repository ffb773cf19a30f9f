/**
 * One line of a recall list: a stored record that counts against the
 * practice on a measure, with what a practice needs to act on it — the
 * reference (the practice's own for its leads, the pseudonym for everyone
 * else), birth year and age band, sex, diabetes type, why it is listed, and
 * the measure's last recorded month and value (for a target the value that
 * fails it, or "not measured").
 */
import type { ReviewWindow, RecordOutcome } from '@cairn/metrics';
import type { MeasureView } from '../../measure-sets/describe.js';
import type { StoredRecord } from '../../database/bulk-load/care-record-row.js';
import { type Reading, readingOf } from './readings.js';
import { type RecallReason, reasonText } from './recall-rule.js';

export interface RecallItem {
  row: number;
  reference: string;
  birthYear: number;
  age: number;
  /** Label of the age band ("40–64") */
  ageBand: string;
  sex: 'F' | 'M' | 'X' | 'U';
  diabetesType: 'type1' | 'type2' | 'other';
  reason: RecallReason;
  reasonText: string;
  /** Month the measure's field was last recorded (single-field measures only) */
  lastRecorded: string | null;
  /** The value that fails the target, "not measured", or the care process's value (single-field measures) */
  value: string | null;
  /** The measures a composite combines that this record does not meet */
  missing: { key: string; label: string }[];
  readings: Reading[];
  /** Everything above that explains the line, in one sentence */
  detail: string;
}

export interface RecallItemContext {
  measure: MeasureView;
  /** Every measure of the set, by key (labels of a composite's parts) */
  measures: ReadonlyMap<string, MeasureView>;
  window: ReviewWindow;
  /** Age-band key → label */
  ageBands: ReadonlyMap<string, string>;
  /** Show the practice's own references (its leads) or pseudonyms (everyone else) */
  showRecordRefs: boolean;
}

export function recallItem(
  stored: StoredRecord,
  outcome: RecordOutcome,
  reason: RecallReason,
  context: RecallItemContext,
): RecallItem {
  const { measure } = context;
  const readings = measure.reads.map((read) => readingOf(stored.record, read, context.window));
  const missing = measure.components
    .filter((key) => {
      const o = outcome.outcomes[key];
      return o !== undefined && o !== 'met' && o !== 'excluded';
    })
    .map((key) => ({ key, label: context.measures.get(key)?.label ?? key }));
  const single = readings.length === 1 ? readings[0]! : null;
  const value =
    single === null
      ? null
      : measure.kind === 'treatment_target' && !single.counts
        ? 'not measured'
        : single.value;
  const ageBandKey = outcome.categories?.ageBand ?? '';
  return {
    row: stored.row,
    reference: context.showRecordRefs ? stored.recordRef : stored.pseudonym,
    birthYear: stored.record.birthYear,
    age: outcome.age,
    ageBand: context.ageBands.get(ageBandKey) ?? ageBandKey,
    sex: stored.record.sex,
    diabetesType: stored.record.diabetesType!,
    reason,
    reasonText: reasonText(measure, reason),
    lastRecorded: single?.month ?? null,
    value,
    missing,
    readings,
    detail: detailOf(measure, readings, missing),
  };
}

function detailOf(measure: MeasureView, readings: Reading[], missing: { label: string }[]): string {
  if (!measure.composite) {
    const r = readings[0];
    return r ? `${r.label}: ${r.text}` : '';
  }
  // A composite care process names the fields not recorded in their window; a composite target
  // names the parts not met and shows every value.
  if (measure.kind === 'care_process') {
    return readings
      .filter((r) => !r.counts)
      .map((r) => `${r.label}: ${r.text}`)
      .join('; ');
  }
  const parts = readings.map((r) => `${r.label}: ${r.text}`);
  if (missing.length > 0) parts.unshift(`Not met: ${missing.map((m) => m.label).join(', ')}`);
  return parts.join('; ');
}
