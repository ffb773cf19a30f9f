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
  const female = sex === 'F';
  const kappa = female ? 0.7 : 0.9;
  const alpha = female ? -0.241 : -0.302;
  const ratio = creatinineUmolL / 88.42 / kappa;
  return (
    142 *
    Math.pow(Math.min(ratio, 1), alpha) *
    Math.pow(Math.max(ratio, 1), -1.2) *
    Math.pow(0.9938, age) *
    (female ? 1.012 : 1)
  );
}
