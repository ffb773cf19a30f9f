import { describe, expect, it } from 'vitest';
import { egfrCkdEpi2021 } from './egfr-ckd-epi-2021.js';
import { kdigoAlbuminuriaCategory, kdigoGfrCategory, kdigoRisk } from './kdigo.js';

/** The published CKD-EPI 2021 equation (Inker et al., N Engl J Med 2021;385:1737–49), in mg/dL. */
function published(scrMgDl: number, age: number, female: boolean): number {
  const kappa = female ? 0.7 : 0.9;
  const alpha = female ? -0.241 : -0.302;
  return (
    142 *
    Math.min(scrMgDl / kappa, 1) ** alpha *
    Math.max(scrMgDl / kappa, 1) ** -1.2 *
    0.9938 ** age *
    (female ? 1.012 : 1)
  );
}

describe('egfrCkdEpi2021', () => {
  it('gives 91.7 for a man of 50 with creatinine 1.0 mg/dL (check value computed from the equation, docs/methods.md §4)', () => {
    const egfr = egfrCkdEpi2021({ creatinineUmolL: 88.42, age: 50, sex: 'M' });
    expect(egfr).toBeCloseTo(91.7, 1);
  });

  it('matches the published equation over a grid (both sexes, both sides of κ)', () => {
    for (const scr of [0.4, 0.6, 0.7, 0.8, 0.9, 1.0, 1.5, 3, 8]) {
      for (const age of [18, 30, 50, 70, 90]) {
        for (const sex of ['F', 'M'] as const) {
          const ours = egfrCkdEpi2021({ creatinineUmolL: scr * 88.42, age, sex });
          expect(ours).toBeCloseTo(published(scr, age, sex === 'F'), 10);
        }
      }
    }
  });

  it('is not computed without sex F or M, or for children', () => {
    expect(egfrCkdEpi2021({ creatinineUmolL: 80, age: 50, sex: 'X' })).toBeNull();
    expect(egfrCkdEpi2021({ creatinineUmolL: 80, age: 50, sex: 'U' })).toBeNull();
    expect(egfrCkdEpi2021({ creatinineUmolL: 80, age: 15, sex: 'F' })).toBeNull();
  });

  it('refuses bad values', () => {
    expect(() => egfrCkdEpi2021({ creatinineUmolL: 0, age: 50, sex: 'M' })).toThrow(
      /creatinineUmolL/,
    );
    expect(() => egfrCkdEpi2021({ creatinineUmolL: 80, age: NaN, sex: 'M' })).toThrow(/age/);
  });
});

describe('KDIGO 2012 categories', () => {
  it.each([
    [120, 'G1'],
    [90, 'G1'],
    [89.99, 'G2'],
    [60, 'G2'],
    [59.9, 'G3a'],
    [45, 'G3a'],
    [44.9, 'G3b'],
    [30, 'G3b'],
    [29.9, 'G4'],
    [15, 'G4'],
    [14.9, 'G5'],
    [0, 'G5'],
  ])('eGFR %f → %s', (egfr, category) => {
    expect(kdigoGfrCategory(egfr)).toBe(category);
  });

  it.each([
    [0, 'A1'],
    [2.99, 'A1'],
    [3, 'A2'],
    [30, 'A2'],
    [30.01, 'A3'],
  ])('ACR %f mg/mmol → %s', (acr, category) => {
    expect(kdigoAlbuminuriaCategory(acr)).toBe(category);
  });

  it('follows the KDIGO 2012 prognosis grid', () => {
    const grid = {
      G1: ['low', 'moderately_increased', 'high'],
      G2: ['low', 'moderately_increased', 'high'],
      G3a: ['moderately_increased', 'high', 'very_high'],
      G3b: ['high', 'very_high', 'very_high'],
      G4: ['very_high', 'very_high', 'very_high'],
      G5: ['very_high', 'very_high', 'very_high'],
    } as const;
    for (const [g, row] of Object.entries(grid)) {
      (['A1', 'A2', 'A3'] as const).forEach((a, i) => {
        expect(kdigoRisk(g as keyof typeof grid, a)).toBe(row[i]);
      });
    }
  });

  it('refuses bad values and categories', () => {
    expect(() => kdigoGfrCategory(-1)).toThrow(/egfr/);
    expect(() => kdigoAlbuminuriaCategory(NaN)).toThrow(/acrMgMmol/);
    expect(() => kdigoRisk('G9' as 'G1', 'A1')).toThrow(/\bg\b/);
    expect(() => kdigoRisk('G1', 'A4' as 'A1')).toThrow(/\ba\b/);
  });
});
