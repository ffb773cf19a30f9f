/**
 * A plain, record-by-record reference of what practice sums hold beyond the outcome histograms
 * (which `evaluateRecords` already gives): the case-mix strata, the insulin life table, the
 * value histograms and the kidney grid, computed from `CareRecord` objects with the package's
 * own per-record rules (evaluateRecord, progressionTime, egfrCkdEpi2021, the KDIGO functions),
 * independently of the columnar code that the sums use.
 */
import fc from 'fast-check';
import {
  ageBandIndex,
  type CareRecord,
  compileMeasureSet,
  durationBandIndex,
  egfrCkdEpi2021,
  evaluateRecord,
  kdigoAlbuminuriaCategory,
  kdigoGfrCategory,
  type MeasureSet,
  monthIndex,
  progressionTime,
  reviewWindow,
  VALUE_HISTOGRAMS,
} from '../src/index.js';
import { valueSlot } from '../src/sums/value-bins.js';
import { arbitraryRecord } from './arbitrary.js';

const QUARTER = { year: 2026, quarter: 3 } as const;

/** Records spread over up to `practices` practices P1 … Pn. */
export function arbitraryRecords(
  practices: number,
  options: { minLength?: number; maxLength?: number } = {},
): fc.Arbitrary<CareRecord[]> {
  const codes = Array.from({ length: practices }, (_, i) => `P${i + 1}`);
  return fc.array(
    fc.tuple(arbitraryRecord, fc.constantFrom(...codes)).map(([r, code]) => ({
      ...r,
      practiceCode: code,
    })),
    { minLength: options.minLength ?? 0, maxLength: options.maxLength ?? 150 },
  );
}

export interface ReferenceSums {
  /** Stratum id → [records, events of each measure, n of each measure]. */
  strata: Map<number, number[]>;
  /** Year → [events, censored]; and the excluded records. */
  insulin: Map<number, [number, number]>;
  excluded: number;
  /** Per type group: histogram key → slot → count. */
  values: Map<string, number>[];
  /** Per type group: 'row/column' → count. */
  kidney: Map<string, number>[];
}

const TYPE_INDEX = { type1: 0, type2: 1, other: 2 } as const;
const SEX_INDEX = { F: 0, M: 1, X: 2, U: 3 } as const;

function bump<K>(map: Map<K, number>, key: K): void {
  map.set(key, (map.get(key) ?? 0) + 1);
}

/** The reference sums of one practice's records. */
export function referenceSums(
  records: readonly CareRecord[],
  set: MeasureSet,
  quarter: { year: number; quarter: 1 | 2 | 3 | 4 } = QUARTER,
): ReferenceSums {
  const compiled = compileMeasureSet(set);
  const w = reviewWindow(quarter, compiled.retinalWindowMonths);
  const inWindow = (month: string | undefined): boolean =>
    month !== undefined && monthIndex(month) >= w.startIndex && monthIndex(month) <= w.endIndex;
  const out: ReferenceSums = {
    strata: new Map(),
    insulin: new Map(),
    excluded: 0,
    values: [new Map(), new Map()],
    kidney: [new Map(), new Map()],
  };
  const M = compiled.measures.length;
  const A = compiled.ageBands.length;
  const D = compiled.durationBands.length + 1;
  for (const r of records) {
    const o = evaluateRecord(r, set, quarter);
    if (!o.eligible || r.diabetesType === null) continue;
    const age = w.endYear - r.birthYear;
    const g = r.diabetesType === 'type1' ? 0 : 1;
    // Stratum: type × age band × sex × deprivation × duration band (compile.ts).
    const a = ageBandIndex(compiled.ageBands, age);
    const d = r.deprivationQuintile === null ? 5 : r.deprivationQuintile - 1;
    const u = durationBandIndex(
      compiled.durationBands,
      r.diagnosisYear === null ? null : w.endYear - r.diagnosisYear,
    );
    const stratum = (((TYPE_INDEX[r.diabetesType] * A + a) * 4 + SEX_INDEX[r.sex]) * 6 + d) * D + u;
    const row = out.strata.get(stratum) ?? new Array<number>(1 + 2 * M).fill(0);
    row[0] = (row[0] as number) + 1;
    compiled.measures.forEach((m, i) => {
      const outcome = o.outcomes[m.key];
      if (outcome === 'met') row[1 + i] = (row[1 + i] as number) + 1;
      const inN =
        m.denominator === 'eligible'
          ? outcome !== 'excluded'
          : outcome === 'met' || outcome === 'not_met';
      if (inN) row[1 + M + i] = (row[1 + M + i] as number) + 1;
    });
    out.strata.set(stratum, row);
    // Insulin (type 2).
    const time = progressionTime(r, w.endYear, compiled.eligibilityMinAge);
    if (time === 'excluded') out.excluded++;
    else if (time !== null) {
      const y = Math.min(time.years, 150);
      const cell = out.insulin.get(y) ?? [0, 0];
      cell[time.event ? 0 : 1]++;
      out.insulin.set(y, cell);
    }
    // Values and kidney.
    const creatinine = inWindow(r.serumCreatinine?.month) ? r.serumCreatinine!.umolL : null;
    let egfr: number | null = null;
    let row9: string;
    if (creatinine === null || !(creatinine > 0)) row9 = 'no_creatinine';
    else if (r.sex !== 'F' && r.sex !== 'M') row9 = 'sex_not_f_or_m';
    else {
      egfr = age < 0 ? null : egfrCkdEpi2021({ creatinineUmolL: creatinine, age, sex: r.sex });
      row9 = egfr === null ? 'under_18' : kdigoGfrCategory(egfr);
    }
    const acr = inWindow(r.urineAlbumin?.month) ? r.urineAlbumin!.acrMgMmol : null;
    const column = acr === null || !(acr >= 0) ? 'no_acr' : kdigoAlbuminuriaCategory(acr);
    bump(out.kidney[g] as Map<string, number>, `${row9}/${column}`);
    const valueOf: Record<string, number | null> = {
      hba1c: inWindow(r.hba1c?.month) ? r.hba1c!.mmolMol : null,
      systolic: inWindow(r.bloodPressure?.month) ? r.bloodPressure!.systolic : null,
      diastolic: inWindow(r.bloodPressure?.month) ? r.bloodPressure!.diastolic : null,
      cholesterol: inWindow(r.cholesterol?.month) ? r.cholesterol!.totalMmolL : null,
      bmi: inWindow(r.bmi?.month) ? r.bmi!.kgM2 : null,
      egfr,
    };
    for (const spec of VALUE_HISTOGRAMS) {
      const v = valueOf[spec.key] ?? null;
      bump(
        out.values[g] as Map<string, number>,
        `${spec.key}/${v === null ? 0 : valueSlot(spec, v)}`,
      );
    }
  }
  return out;
}
