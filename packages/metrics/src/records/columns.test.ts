import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { complete, record } from '../../test/records.js';
import { arbitraryRecord } from '../../test/arbitrary.js';
import {
  type CodedCareRecord,
  createColumnBuilder,
  type FlatCareRecord,
  MISSING_MONTH,
  MISSING_YEAR,
  recordAt,
  SEX_CODES,
  SMOKING_CODES,
  toColumns,
} from './columns.js';
import { isMonth, monthFromIndex, monthIndex, yearOfMonthIndex } from './month.js';
import type { CareRecord } from './record.js';

function flat(r: CareRecord): FlatCareRecord {
  return {
    practiceCode: r.practiceCode,
    recordKey: r.recordKey,
    birthYear: r.birthYear,
    sex: r.sex,
    diabetesType: r.diabetesType,
    diagnosisYear: r.diagnosisYear,
    deprivationQuintile: r.deprivationQuintile,
    hba1cMonth: r.hba1c?.month ?? null,
    hba1cMmolMol: r.hba1c?.mmolMol ?? null,
    bloodPressureMonth: r.bloodPressure?.month ?? null,
    systolic: r.bloodPressure?.systolic ?? null,
    diastolic: r.bloodPressure?.diastolic ?? null,
    cholesterolMonth: r.cholesterol?.month ?? null,
    totalCholesterolMmolL: r.cholesterol?.totalMmolL ?? null,
    serumCreatinineMonth: r.serumCreatinine?.month ?? null,
    serumCreatinineUmolL: r.serumCreatinine?.umolL ?? null,
    urineAlbuminMonth: r.urineAlbumin?.month ?? null,
    acrMgMmol: r.urineAlbumin?.acrMgMmol ?? null,
    footSurveillanceMonth: r.footSurveillance?.month ?? null,
    bmiMonth: r.bmi?.month ?? null,
    bmiKgM2: r.bmi?.kgM2 ?? null,
    smokingMonth: r.smoking?.month ?? null,
    smokingStatus: r.smoking?.status ?? null,
    retinalScreeningMonth: r.retinalScreening?.month ?? null,
    onStatin: r.onStatin,
    onInsulin: r.onInsulin,
    insulinStartYear: r.insulinStartYear,
    cvdHistory: r.cvdHistory,
  };
}

/** The same row in codes, as MariaDB sends it for the sums (ENUM + 0, month indices). */
function coded(r: CareRecord): CodedCareRecord {
  const f = flat(r);
  const m = (x: string | null) => (x === null ? null : monthIndex(x));
  return {
    ...f,
    sex: SEX_CODES.indexOf(f.sex),
    diabetesType:
      f.diabetesType === null ? 0 : ['type1', 'type2', 'other'].indexOf(f.diabetesType) + 1,
    hba1cMonth: m(f.hba1cMonth),
    bloodPressureMonth: m(f.bloodPressureMonth),
    cholesterolMonth: m(f.cholesterolMonth),
    serumCreatinineMonth: m(f.serumCreatinineMonth),
    urineAlbuminMonth: m(f.urineAlbuminMonth),
    footSurveillanceMonth: m(f.footSurveillanceMonth),
    bmiMonth: m(f.bmiMonth),
    smokingMonth: m(f.smokingMonth),
    smokingStatus: SMOKING_CODES.indexOf(f.smokingStatus),
    retinalScreeningMonth: m(f.retinalScreeningMonth),
  };
}

describe('month indices', () => {
  it('convert both ways and count months', () => {
    expect(monthIndex('2026-09') - monthIndex('2025-10')).toBe(11);
    expect(monthFromIndex(monthIndex('2026-01'))).toBe('2026-01');
    expect(monthFromIndex(monthIndex('0999-12'))).toBe('0999-12');
    expect(yearOfMonthIndex(monthIndex('2026-12'))).toBe(2026);
    expect(isMonth('2026-13')).toBe(false);
    expect(isMonth('2026-1')).toBe(false);
    expect(() => monthIndex('2026-00')).toThrow(/month/);
    expect(() => monthIndex('26-01')).toThrow(RangeError);
    expect(() => monthFromIndex(1.5)).toThrow(/index/);
  });
});

describe('columnar form', () => {
  it('round-trips records through toColumns and recordAt (property)', () => {
    fc.assert(
      fc.property(fc.array(arbitraryRecord, { maxLength: 30 }), (records) => {
        const columns = toColumns(records, { keepRecordKeys: true });
        expect(columns.length).toBe(records.length);
        records.forEach((r, i) => expect(recordAt(columns, i)).toEqual(r));
      }),
    );
  });

  it('builds the same columns from flat rows as from records', () => {
    fc.assert(
      fc.property(fc.array(arbitraryRecord, { maxLength: 20 }), (records) => {
        const a = toColumns(records);
        const builder = createColumnBuilder({ capacity: 1 });
        for (const r of records) builder.appendFlat(flat(r));
        const b = builder.finish();
        expect(b).toEqual(a);
      }),
    );
  });

  it('builds the same columns from coded rows as from flat rows', () => {
    fc.assert(
      fc.property(fc.array(arbitraryRecord, { maxLength: 20 }), (records) => {
        const a = createColumnBuilder({ capacity: 1 });
        const b = createColumnBuilder({ capacity: 1 });
        for (const r of records) {
          a.appendFlat(flat(r));
          b.appendCoded(coded(r));
        }
        expect(b.finish()).toEqual(a.finish());
      }),
    );
  });

  it('builds, after reset, the same columns as a new builder, whatever it held before (property)', () => {
    fc.assert(
      fc.property(
        fc.array(arbitraryRecord, { maxLength: 20 }),
        fc.array(arbitraryRecord, { maxLength: 20 }),
        fc.boolean(),
        (before, records, keepRecordKeys) => {
          const options = { capacity: 4, keepRecordKeys, practiceCodes: ['Z9'] };
          const fresh = createColumnBuilder(options);
          for (const r of records) fresh.append(r);
          const reused = createColumnBuilder(options);
          for (const r of before) reused.appendCoded(coded(r));
          // A row refused half-way leaves values in the arrays; the next row overwrites them.
          const late = { ...coded(record({})), smokingMonth: 24_300, smokingStatus: 0 };
          expect(() => reused.appendCoded(late)).toThrow(/smokingStatus is required/);
          const held = reused.finish();
          const heldCodes = [...held.practiceCodes];
          reused.reset();
          expect(held.practiceCodes).toEqual(heldCodes);
          for (const r of records) reused.append(r);
          expect(reused.finish()).toEqual(fresh.finish());
        },
      ),
    );
  });

  it('refuses coded rows whose codes or month indices cannot be', () => {
    const row = coded(record({}));
    const b = createColumnBuilder();
    expect(() => b.appendCoded({ ...row, sex: 4 })).toThrow(/sex must be a code/);
    expect(() => b.appendCoded({ ...row, diabetesType: 7 })).toThrow(/diabetesType/);
    expect(() => b.appendCoded({ ...row, hba1cMonth: 3.5 })).toThrow(/hba1c must be a month index/);
    expect(() => b.appendCoded({ ...row, smokingMonth: 24_300, smokingStatus: 0 })).toThrow(
      /smokingStatus is required/,
    );
    expect(b.length).toBe(0);
  });

  it('encodes missing values with the documented sentinels', () => {
    const columns = toColumns([record({ diagnosisYear: null })]);
    expect(columns.months.hba1c[0]).toBe(MISSING_MONTH);
    expect(columns.diagnosisYear[0]).toBe(MISSING_YEAR);
    expect(Number.isNaN(columns.values.systolic[0])).toBe(true);
    expect(columns.onStatin[0]).toBe(0);
    expect(columns.deprivation[0]).toBe(3);
    expect(columns.recordKeys).toBeNull();
  });

  it('indexes preset practices first and new ones in order of appearance', () => {
    const columns = toColumns([record({ practiceCode: 'B' }), record({ practiceCode: 'C' })], {
      practiceCodes: ['A', 'B'],
    });
    expect(columns.practiceCodes).toEqual(['A', 'B', 'C']);
    expect(Array.from(columns.practice)).toEqual([1, 2]);
  });

  it('refuses a value it cannot encode, naming the record and field', () => {
    const builder = createColumnBuilder();
    expect(() => builder.append(complete('2026-13'))).toThrow(/record 0: hba1c/);
    expect(() => builder.append(record({ birthYear: 1960.5 }))).toThrow(/birthYear/);
    expect(() => builder.append(record({ sex: 'Q' as 'F' }))).toThrow(/sex/);
    expect(() =>
      builder.append(record({ hba1c: { month: '2026-01', mmolMol: Number.NaN } })),
    ).toThrow(/hba1c/);
    expect(() => builder.append(record({ deprivationQuintile: 7 as 1 }))).toThrow(/deprivation/);
    expect(() => builder.append(record({ practiceCode: '' }))).toThrow(/practiceCode/);
    expect(builder.length).toBe(0);
    builder.append(record());
    expect(builder.finish().length).toBe(1);
    expect(() => builder.append(record())).toThrow(/finished/);
  });
});
