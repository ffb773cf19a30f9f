import type { Sex } from '../records/record.js';
import { assertFinite } from '../units/assert-finite.js';

/**
 * eGFR (mL/min/1.73 m²) by the CKD-EPI 2021 creatinine equation without race (L. A. Inker et
 * al., N Engl J Med 2021;385:1737–49):
 * eGFR = 142 × min(Scr/κ, 1)^α × max(Scr/κ, 1)^−1.200 × 0.9938^age × 1.012 [if female],
 * Scr in mg/dL (µmol/L ÷ 88.42), κ = 0.7 (F) / 0.9 (M), α = −0.241 (F) / −0.302 (M).
 * The equation needs sex F or M and an adult (age ≥ 18, the population it was developed in):
 * otherwise the result is null (not computed). Unrounded.
 */
export interface EgfrInput {
  creatinineUmolL: number;
  /** Age in whole years. */
  age: number;
  sex: Sex;
}

export function egfrCkdEpi2021(input: EgfrInput): number | null {
  const { creatinineUmolL, age, sex } = input;
  assertFinite(creatinineUmolL, 'creatinineUmolL');
  assertFinite(age, 'age');
  if (!(creatinineUmolL > 0)) {
    throw new RangeError(`creatinineUmolL must be > 0 (got ${creatinineUmolL})`);
  }
  if (age < 0) throw new RangeError(`age must be ≥ 0 (got ${age})`);
  if (sex !== 'F' && sex !== 'M') return null;
  if (age < 18) return null;
  return egfrUnchecked(creatinineUmolL, age, sex === 'F');
}

/** 0.9938^age for whole ages 0 … 150, the same numbers Math.pow gives, computed once. */
const AGE_FACTOR = Float64Array.from({ length: 151 }, (_, age) => Math.pow(0.9938, age));

/**
 * The equation without argument checks, for loops over many records (creatinine > 0 and age
 * finite). Each factor is what Math.pow gives for it, without calling it needlessly: a factor
 * min(·, 1)^α or max(·, 1)^−1.2 whose base is 1 is 1, and 0.9938^age of a whole age comes from
 * a table of Math.pow results.
 */
export function egfrUnchecked(creatinineUmolL: number, age: number, female: boolean): number {
  const kappa = female ? 0.7 : 0.9;
  const alpha = female ? -0.241 : -0.302;
  const ratio = creatinineUmolL / 88.42 / kappa;
  const ageFactor =
    Number.isInteger(age) && age <= 150 ? (AGE_FACTOR[age] as number) : Math.pow(0.9938, age);
  return (
    142 *
    (ratio < 1 ? Math.pow(ratio, alpha) : 1) *
    (ratio > 1 ? Math.pow(ratio, -1.2) : 1) *
    ageFactor *
    (female ? 1.012 : 1)
  );
}
