/** fast-check generators of care records around the review window of 2026 Q3. */
import fc from 'fast-check';
import type { CareRecord, Month } from '../src/index.js';

/** Months from 2024-06 to 2026-12: inside, just outside and after the window 2025-10…2026-09. */
export const arbitraryMonth: fc.Arbitrary<Month> = fc
  .integer({ min: 2024 * 12 + 5, max: 2026 * 12 + 11 })
  .map((i) => `${Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}`);

/** Values near the default thresholds, so that every comparison goes both ways. */
const near = (points: number[], spread: number): fc.Arbitrary<number> =>
  fc.oneof(
    fc.constantFrom(...points),
    fc.double({
      min: Math.min(...points) - spread,
      max: Math.max(...points) + spread,
      noNaN: true,
    }),
  );

const maybe = <T>(a: fc.Arbitrary<T>): fc.Arbitrary<T | null> =>
  fc.option(a, { nil: null, freq: 3 });

export const arbitraryRecord: fc.Arbitrary<CareRecord> = fc.record({
  practiceCode: fc.constantFrom('P1', 'P2', 'P3', 'P4', 'P5'),
  recordKey: fc.string({ maxLength: 6 }),
  birthYear: fc.integer({ min: 1915, max: 2018 }),
  sex: fc.constantFrom('F', 'M', 'X', 'U'),
  diabetesType: fc.constantFrom('type1', 'type2', 'type2', 'other', null),
  diagnosisYear: maybe(fc.integer({ min: 1960, max: 2027 })),
  deprivationQuintile: maybe(fc.constantFrom(1, 2, 3, 4, 5)),
  hba1c: maybe(fc.record({ month: arbitraryMonth, mmolMol: near([48, 53, 58, 75], 20) })),
  bloodPressure: maybe(
    fc.record({
      month: arbitraryMonth,
      systolic: near([130, 140, 150], 15),
      diastolic: near([80, 90], 10),
    }),
  ),
  cholesterol: maybe(fc.record({ month: arbitraryMonth, totalMmolL: near([5], 2) })),
  serumCreatinine: maybe(
    fc.record({ month: arbitraryMonth, umolL: fc.double({ min: 20, max: 900, noNaN: true }) }),
  ),
  urineAlbumin: maybe(fc.record({ month: arbitraryMonth, acrMgMmol: near([3, 30], 5) })),
  footSurveillance: maybe(fc.record({ month: arbitraryMonth })),
  bmi: maybe(
    fc.record({ month: arbitraryMonth, kgM2: fc.double({ min: 15, max: 60, noNaN: true }) }),
  ),
  smoking: maybe(
    fc.record({ month: arbitraryMonth, status: fc.constantFrom('current', 'ex', 'never') }),
  ),
  retinalScreening: maybe(fc.record({ month: arbitraryMonth })),
  onStatin: fc.constantFrom(true, false, null),
  onInsulin: fc.constantFrom(true, false, null),
  insulinStartYear: maybe(fc.integer({ min: 1960, max: 2027 })),
  cvdHistory: fc.constantFrom(true, false, null),
}) as fc.Arbitrary<CareRecord>;
