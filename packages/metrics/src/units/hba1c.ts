import { assertFinite } from './assert-finite.js';

/**
 * HbA1c between NGSP/DCCT per cent and IFCC mmol/mol, by the IFCC–NGSP master equation
 * (W. Hoelzel et al., Clin Chem 2004;50:166–74): mmol/mol = (% − 2.15) × 10.929 and its
 * published inverse % = 0.09148 × mmol/mol + 2.152. Unrounded; round for display only.
 */
export function hba1cMmolMolFromPercent(percent: number): number {
  assertFinite(percent, 'percent');
  return (percent - 2.15) * 10.929;
}

export function hba1cPercentFromMmolMol(mmolMol: number): number {
  assertFinite(mmolMol, 'mmolMol');
  return 0.09148 * mmolMol + 2.152;
}
