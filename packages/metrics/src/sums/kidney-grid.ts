import { egfrUnchecked } from '../kidney/egfr-ckd-epi-2021.js';
import {
  type AlbuminuriaCategory,
  type GfrCategory,
  kdigoAlbuminuriaCategory,
  kdigoGfrCategory,
} from '../kidney/kdigo.js';

/**
 * The kidney grid of the sums: eligible records by KDIGO 2012 GFR category × albuminuria
 * category (KDIGO 2012 Clinical Practice Guideline for the Evaluation and Management of Chronic
 * Kidney Disease, Kidney Int Suppl 2013;3:1–150), per type group, with eGFR by the CKD-EPI 2021
 * equation (Inker et al., N Engl J Med 2021;385:1737–49) from the latest creatinine of the
 * review window, the record's sex and its age at the end of the window (kidney/ functions).
 *
 * Rows are the six GFR categories, then why eGFR could not be computed, first reason that
 * applies: no creatinine result in the window (or not a positive value), sex not recorded as
 * F or M, under 18 (the equation's population). Columns are the three albuminuria categories,
 * then no ACR result in the window (or a negative value). So every eligible record is in exactly
 * one cell and the margins say how many records lack a category and why.
 */
export const KIDNEY_ROWS = [
  'G1',
  'G2',
  'G3a',
  'G3b',
  'G4',
  'G5',
  'no_creatinine',
  'sex_not_f_or_m',
  'under_18',
] as const;
export const KIDNEY_COLUMNS = ['A1', 'A2', 'A3', 'no_acr'] as const;
export type KidneyRow = (typeof KIDNEY_ROWS)[number];
export type KidneyColumn = (typeof KIDNEY_COLUMNS)[number];
export const KIDNEY_CELLS = KIDNEY_ROWS.length * KIDNEY_COLUMNS.length;

const GFR_ROW: Record<GfrCategory, number> = { G1: 0, G2: 1, G3a: 2, G3b: 3, G4: 4, G5: 5 };
const ACR_COLUMN: Record<AlbuminuriaCategory, number> = { A1: 0, A2: 1, A3: 2 };
const NO_CREATININE = 6;
const SEX_NOT_F_OR_M = 7;
const UNDER_18 = 8;
const NO_ACR = 3;

/**
 * The eGFR of a record for the grid, or why it cannot be computed, as one number (no object per
 * record): the eGFR (≥ 0), or −1 no creatinine (NaN, or not a positive value), −2 sex not F or
 * M (sex code 0 F, 1 M as in the columnar form), −3 under 18. The eGFR is exactly
 * `egfrCkdEpi2021`'s.
 */
export function egfrOrReason(creatinineUmolL: number, sexCode: number, age: number): number {
  if (!(creatinineUmolL > 0) || creatinineUmolL === Infinity) return -1;
  if (sexCode !== 0 && sexCode !== 1) return -2;
  if (!(age >= 18) || age === Infinity) return -3;
  return egfrUnchecked(creatinineUmolL, age, sexCode === 0);
}

/** The grid row of `egfrOrReason`'s result. */
export function kidneyRow(egfrOrCode: number): number {
  if (egfrOrCode >= 0) return GFR_ROW[kdigoGfrCategory(egfrOrCode)];
  return egfrOrCode === -1 ? NO_CREATININE : egfrOrCode === -2 ? SEX_NOT_F_OR_M : UNDER_18;
}

/** The grid column of an ACR (mg/mmol; NaN when there is none), or no ACR. */
export function acrColumn(acrMgMmol: number): number {
  if (!(acrMgMmol >= 0) || acrMgMmol === Infinity) return NO_ACR;
  return ACR_COLUMN[kdigoAlbuminuriaCategory(acrMgMmol)];
}

/** Cell index of a row and column (row-major). */
export function kidneyCell(row: number, column: number): number {
  return row * KIDNEY_COLUMNS.length + column;
}
