/**
 * What a record holds for one field a measure reads, for a recall list: the
 * month last recorded (even before the window: a practice wants to know how
 * long ago), the value with its unit, and whether it counts in the window.
 */
import { monthIndex, type CareRecord, type ReviewWindow } from '@cairn/metrics';
import {
  READING_LABELS,
  type MeasureReading,
  type ReadingField,
} from '../../measure-sets/describe.js';

export interface Reading {
  field: ReadingField;
  label: string;
  /** Month last recorded, 'YYYY-MM'; null when never recorded or for yes/no facts */
  month: string | null;
  /** Recorded in the measure's window (yes/no facts: recorded at all) */
  counts: boolean;
  /** The value with its unit ("62 mmol/mol", "148/92 mmHg", "yes"); null when none */
  value: string | null;
  /** The value's numbers, in canonical units (blood pressure: systolic, diastolic) */
  numbers: number[];
  /** The reading in words */
  text: string;
}

/** Up to one decimal, without trailing zeros: 62, 4.3, 29.5. */
export function formatNumber(value: number): string {
  return String(Math.round(value * 10) / 10);
}

const SMOKING: Record<'current' | 'ex' | 'never', string> = {
  current: 'current smoker',
  ex: 'ex-smoker',
  never: 'never smoked',
};

function entryOf(
  record: CareRecord,
  field: ReadingField,
): { month: string | null; value: string | null; numbers: number[] } | null {
  switch (field) {
    case 'hba1c':
      return (
        record.hba1c && {
          month: record.hba1c.month,
          value: `${formatNumber(record.hba1c.mmolMol)} mmol/mol`,
          numbers: [record.hba1c.mmolMol],
        }
      );
    case 'bloodPressure': {
      const bp = record.bloodPressure;
      return (
        bp && {
          month: bp.month,
          value: `${formatNumber(bp.systolic)}/${formatNumber(bp.diastolic)} mmHg`,
          numbers: [bp.systolic, bp.diastolic],
        }
      );
    }
    case 'cholesterol':
      return (
        record.cholesterol && {
          month: record.cholesterol.month,
          value: `${formatNumber(record.cholesterol.totalMmolL)} mmol/L`,
          numbers: [record.cholesterol.totalMmolL],
        }
      );
    case 'serumCreatinine':
      return (
        record.serumCreatinine && {
          month: record.serumCreatinine.month,
          value: `${formatNumber(record.serumCreatinine.umolL)} µmol/L`,
          numbers: [record.serumCreatinine.umolL],
        }
      );
    case 'urineAlbumin':
      return (
        record.urineAlbumin && {
          month: record.urineAlbumin.month,
          value: `${formatNumber(record.urineAlbumin.acrMgMmol)} mg/mmol`,
          numbers: [record.urineAlbumin.acrMgMmol],
        }
      );
    case 'bmi':
      return (
        record.bmi && {
          month: record.bmi.month,
          value: `${formatNumber(record.bmi.kgM2)} kg/m²`,
          numbers: [record.bmi.kgM2],
        }
      );
    case 'smoking':
      return (
        record.smoking && {
          month: record.smoking.month,
          value: SMOKING[record.smoking.status],
          numbers: [],
        }
      );
    case 'footSurveillance':
      return (
        record.footSurveillance && {
          month: record.footSurveillance.month,
          value: null,
          numbers: [],
        }
      );
    case 'retinalScreening':
      return (
        record.retinalScreening && {
          month: record.retinalScreening.month,
          value: null,
          numbers: [],
        }
      );
    case 'onStatin':
    case 'onInsulin':
    case 'cvdHistory': {
      const fact = record[field];
      return fact === null ? null : { month: null, value: fact ? 'yes' : 'no', numbers: [] };
    }
  }
}

export function readingOf(record: CareRecord, read: MeasureReading, window: ReviewWindow): Reading {
  const label = READING_LABELS[read.field];
  const entry = entryOf(record, read.field);
  if (entry === null) {
    return {
      field: read.field,
      label,
      month: null,
      counts: false,
      value: null,
      numbers: [],
      text: 'Not recorded',
    };
  }
  if (read.window === null || entry.month === null) {
    return {
      field: read.field,
      label,
      month: null,
      counts: true,
      value: entry.value,
      numbers: entry.numbers,
      text: entry.value ?? 'Recorded',
    };
  }
  const from = read.window === 'retinal' ? window.retinalStartIndex : window.startIndex;
  const index = monthIndex(entry.month);
  const counts = index >= from && index <= window.endIndex;
  const what =
    entry.value === null ? `Recorded in ${entry.month}` : `${entry.value} in ${entry.month}`;
  const text = counts
    ? what
    : `${what}, before the ${read.window === 'retinal' ? 'retinal' : 'review'} window`;
  return {
    field: read.field,
    label,
    month: entry.month,
    counts,
    value: entry.value,
    numbers: entry.numbers,
    text,
  };
}
