import { assertFinite } from './assert-finite.js';

/** Total cholesterol: mmol/L = mg/dL ÷ 38.67 (molar mass of cholesterol 386.65 g/mol). */
export function cholesterolMmolLFromMgDl(mgDl: number): number {
  assertFinite(mgDl, 'mgDl');
  return mgDl / 38.67;
}

export function cholesterolMgDlFromMmolL(mmolL: number): number {
  assertFinite(mmolL, 'mmolL');
  return mmolL * 38.67;
}
