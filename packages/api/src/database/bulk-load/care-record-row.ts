/**
 * A stored care_records row as the metrics engine reads it: `CareRecord`
 * (@cairn/metrics, records/record.ts), with the row's place in its extract
 * and both references. Nothing is recomputed: values are in canonical units
 * and months are 'YYYY-MM' as staged.
 */
import type {
  CareRecord,
  DeprivationQuintile,
  DiabetesType,
  Sex,
  SmokingStatus,
} from '@cairn/metrics';
import { CARE_COLUMNS } from './record-columns.js';

/** The columns read, in this order (a SELECT list; table alias optional). */
export const CARE_RECORD_SELECT = ['source_row', 'record_ref', 'pseudonym', ...CARE_COLUMNS].join(
  ', ',
);

export interface CareRecordRow {
  source_row: number;
  record_ref: string;
  pseudonym: string;
  birth_year: number;
  sex: Sex;
  diabetes_type: DiabetesType | null;
  diagnosis_year: number | null;
  deprivation_quintile: number | null;
  hba1c_month: string | null;
  hba1c_mmol_mol: number | null;
  blood_pressure_month: string | null;
  systolic: number | null;
  diastolic: number | null;
  cholesterol_month: string | null;
  total_cholesterol_mmol_l: number | null;
  serum_creatinine_month: string | null;
  serum_creatinine_umol_l: number | null;
  urine_albumin_month: string | null;
  acr_mg_mmol: number | null;
  foot_surveillance_month: string | null;
  bmi_month: string | null;
  bmi_kg_m2: number | null;
  smoking_month: string | null;
  smoking_status: SmokingStatus | null;
  retinal_screening_month: string | null;
  on_statin: number | boolean | null;
  on_insulin: number | boolean | null;
  insulin_start_year: number | null;
  cvd_history: number | boolean | null;
}

/** One stored record: where it was in the extract, its two references, and the record itself. */
export interface StoredRecord {
  /** Spreadsheet row number in the extract (heading row included) */
  row: number;
  /** The practice's own reference (shown only to the practice's leads) */
  recordRef: string;
  /** Its keyed pseudonym (docs/methods.md §9), for everyone else */
  pseudonym: string;
  record: CareRecord;
}

const flag = (value: number | boolean | null): boolean | null =>
  value === null ? null : Boolean(Number(value));

/** A measurement is kept only with both its month and its value (as staged). */
function measured<T>(month: string | null, value: number | null, make: (v: number) => T) {
  return month !== null && value !== null ? { month, ...make(Number(value)) } : null;
}

export function toStoredRecord(row: CareRecordRow, practiceCode: string): StoredRecord {
  const bp =
    row.blood_pressure_month !== null && row.systolic !== null && row.diastolic !== null
      ? {
          month: row.blood_pressure_month,
          systolic: Number(row.systolic),
          diastolic: Number(row.diastolic),
        }
      : null;
  return {
    row: Number(row.source_row),
    recordRef: row.record_ref,
    pseudonym: row.pseudonym,
    record: {
      practiceCode,
      recordKey: row.record_ref,
      birthYear: Number(row.birth_year),
      sex: row.sex,
      diabetesType: row.diabetes_type,
      diagnosisYear: row.diagnosis_year === null ? null : Number(row.diagnosis_year),
      deprivationQuintile:
        row.deprivation_quintile === null
          ? null
          : (Number(row.deprivation_quintile) as DeprivationQuintile),
      hba1c: measured(row.hba1c_month, row.hba1c_mmol_mol, (mmolMol) => ({ mmolMol })),
      bloodPressure: bp,
      cholesterol: measured(row.cholesterol_month, row.total_cholesterol_mmol_l, (totalMmolL) => ({
        totalMmolL,
      })),
      serumCreatinine: measured(
        row.serum_creatinine_month,
        row.serum_creatinine_umol_l,
        (umolL) => ({
          umolL,
        }),
      ),
      urineAlbumin: measured(row.urine_albumin_month, row.acr_mg_mmol, (acrMgMmol) => ({
        acrMgMmol,
      })),
      footSurveillance:
        row.foot_surveillance_month === null ? null : { month: row.foot_surveillance_month },
      bmi: measured(row.bmi_month, row.bmi_kg_m2, (kgM2) => ({ kgM2 })),
      smoking:
        row.smoking_month !== null && row.smoking_status !== null
          ? { month: row.smoking_month, status: row.smoking_status }
          : null,
      retinalScreening:
        row.retinal_screening_month === null ? null : { month: row.retinal_screening_month },
      onStatin: flag(row.on_statin),
      onInsulin: flag(row.on_insulin),
      insulinStartYear: row.insulin_start_year === null ? null : Number(row.insulin_start_year),
      cvdHistory: flag(row.cvd_history),
    },
  };
}
