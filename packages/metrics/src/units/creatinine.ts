import { assertFinite } from './assert-finite.js';

/** Creatinine: µmol/L = mg/dL × 88.42 (molar mass of creatinine 113.12 g/mol). Unrounded. */
export function creatinineUmolLFromMgDl(mgDl: number): number {
  assertFinite(mgDl, 'mgDl');
  return mgDl * 88.42;
}

export function creatinineMgDlFromUmolL(umolL: number): number {
  assertFinite(umolL, 'umolL');
  return umolL / 88.42;
}
