import { assertFinite } from './assert-finite.js';

/**
 * Urine albumin:creatinine ratio: mg/mmol = mg/g ÷ 8.84 (1 g of creatinine is 8.84 mmol, from
 * its molar mass 113.12 g/mol). Unrounded.
 */
export function acrMgMmolFromMgG(mgG: number): number {
  assertFinite(mgG, 'mgG');
  return mgG / 8.84;
}

export function acrMgGFromMgMmol(mgMmol: number): number {
  assertFinite(mgMmol, 'mgMmol');
  return mgMmol * 8.84;
}
