import { describe, expect, it } from 'vitest';
import { acrMgGFromMgMmol, acrMgMmolFromMgG } from './acr.js';
import { cholesterolMgDlFromMmolL, cholesterolMmolLFromMgDl } from './cholesterol.js';
import { creatinineMgDlFromUmolL, creatinineUmolLFromMgDl } from './creatinine.js';
import { glucoseMgDlFromMmolL, glucoseMmolLFromMgDl } from './glucose.js';
import { hba1cMmolMolFromPercent, hba1cPercentFromMmolMol } from './hba1c.js';

describe('HbA1c (IFCC–NGSP master equation, Hoelzel et al., Clin Chem 2004;50:166–74)', () => {
  // The IFCC–NGSP conversion table of docs/methods.md §6 (whole mmol/mol).
  it.each([
    [6.0, 42],
    [6.5, 48],
    [7.0, 53],
    [7.5, 58],
    [8.0, 64],
    [9.0, 75],
    [10.0, 86],
  ])('%f %% → %i mmol/mol', (percent, mmolMol) => {
    expect(Math.round(hba1cMmolMolFromPercent(percent))).toBe(mmolMol);
    expect(hba1cPercentFromMmolMol(mmolMol)).toBeCloseTo(percent, 1);
  });

  it('is unrounded and follows the published equations exactly', () => {
    expect(hba1cMmolMolFromPercent(7)).toBeCloseTo((7 - 2.15) * 10.929, 12);
    expect(hba1cPercentFromMmolMol(53)).toBeCloseTo(0.09148 * 53 + 2.152, 12);
  });

  it('refuses a value that is not a finite number', () => {
    expect(() => hba1cMmolMolFromPercent(NaN)).toThrow(/percent/);
    expect(() => hba1cPercentFromMmolMol(Infinity)).toThrow(/mmolMol/);
  });
});

describe('other conversions (molar masses, docs/methods.md §6)', () => {
  it('converts glucose at 18.016 mg/dL per mmol/L (glucose 180.16 g/mol)', () => {
    expect(glucoseMmolLFromMgDl(126)).toBeCloseTo(6.99, 2); // WHO fasting threshold 7.0 mmol/L
    expect(glucoseMgDlFromMmolL(glucoseMmolLFromMgDl(200))).toBeCloseTo(200, 12);
  });

  it('converts total cholesterol at 38.67 mg/dL per mmol/L (386.65 g/mol)', () => {
    expect(cholesterolMmolLFromMgDl(193.35)).toBeCloseTo(5.0, 2);
    expect(cholesterolMgDlFromMmolL(5)).toBeCloseTo(193.35, 12);
  });

  it('converts creatinine at 88.42 µmol/L per mg/dL (113.12 g/mol)', () => {
    expect(creatinineUmolLFromMgDl(1)).toBe(88.42);
    expect(creatinineMgDlFromUmolL(88.42)).toBeCloseTo(1, 15);
  });

  it('converts ACR at 8.84 mg/g per mg/mmol', () => {
    expect(acrMgMmolFromMgG(30)).toBeCloseTo(3.394, 3); // the A1/A2 boundary: 30 mg/g ≈ 3 mg/mmol
    expect(acrMgGFromMgMmol(acrMgMmolFromMgG(300))).toBeCloseTo(300, 12);
    expect(() => acrMgMmolFromMgG(Number.NaN)).toThrow(/mgG/);
  });
});
