import { assertFinite } from './assert-finite.js';

/** Glucose: mmol/L = mg/dL ÷ 18.016 (molar mass of glucose 180.16 g/mol). Unrounded. */
export function glucoseMmolLFromMgDl(mgDl: number): number {
  assertFinite(mgDl, 'mgDl');
  return mgDl / 18.016;
}

export function glucoseMgDlFromMmolL(mmolL: number): number {
  assertFinite(mmolL, 'mmolL');
  return mmolL * 18.016;
}
