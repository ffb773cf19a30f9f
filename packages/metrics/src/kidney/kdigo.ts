import { assertFinite } from '../units/assert-finite.js';

/**
 * KDIGO 2012 chronic kidney disease categories (KDIGO 2012 Clinical Practice Guideline for the
 * Evaluation and Management of Chronic Kidney Disease, Kidney Int Suppl 2013;3:1–150):
 * GFR G1 ≥ 90, G2 60–89, G3a 45–59, G3b 30–44, G4 15–29, G5 < 15 mL/min/1.73 m²;
 * albuminuria by ACR A1 < 3, A2 3–30, A3 > 30 mg/mmol; and the prognosis grid (risk of adverse
 * outcomes) low / moderately increased / high / very high.
 * Values are classified as given: a value between whole numbers (e.g. 89.6) falls in the lower
 * category; round first when the category should follow a rounded report.
 */
export type GfrCategory = 'G1' | 'G2' | 'G3a' | 'G3b' | 'G4' | 'G5';
export type AlbuminuriaCategory = 'A1' | 'A2' | 'A3';
export type KidneyRisk = 'low' | 'moderately_increased' | 'high' | 'very_high';

export function kdigoGfrCategory(egfr: number): GfrCategory {
  assertFinite(egfr, 'egfr');
  if (egfr < 0) throw new RangeError(`egfr must be ≥ 0 (got ${egfr})`);
  if (egfr >= 90) return 'G1';
  if (egfr >= 60) return 'G2';
  if (egfr >= 45) return 'G3a';
  if (egfr >= 30) return 'G3b';
  if (egfr >= 15) return 'G4';
  return 'G5';
}

export function kdigoAlbuminuriaCategory(acrMgMmol: number): AlbuminuriaCategory {
  assertFinite(acrMgMmol, 'acrMgMmol');
  if (acrMgMmol < 0) throw new RangeError(`acrMgMmol must be ≥ 0 (got ${acrMgMmol})`);
  if (acrMgMmol < 3) return 'A1';
  if (acrMgMmol <= 30) return 'A2';
  return 'A3';
}

const GRID: Record<GfrCategory, Record<AlbuminuriaCategory, KidneyRisk>> = {
  G1: { A1: 'low', A2: 'moderately_increased', A3: 'high' },
  G2: { A1: 'low', A2: 'moderately_increased', A3: 'high' },
  G3a: { A1: 'moderately_increased', A2: 'high', A3: 'very_high' },
  G3b: { A1: 'high', A2: 'very_high', A3: 'very_high' },
  G4: { A1: 'very_high', A2: 'very_high', A3: 'very_high' },
  G5: { A1: 'very_high', A2: 'very_high', A3: 'very_high' },
};

export function kdigoRisk(g: GfrCategory, a: AlbuminuriaCategory): KidneyRisk {
  const row = GRID[g];
  if (row === undefined) throw new RangeError(`g must be a GFR category G1…G5 (got ${String(g)})`);
  const risk = row[a];
  if (risk === undefined) throw new RangeError(`a must be A1, A2 or A3 (got ${String(a)})`);
  return risk;
}
