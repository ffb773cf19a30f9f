/**
 * The steps of the results routes that need no database, as tables of cases:
 * disclosure of region figures and peers on a practice's page (peer-disclosure.ts,
 * docs/methods.md §9), the stored form of a result (result-body.ts), and trends with gaps
 * (views.ts). The figures are worked by hand from the rules.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import {
  buildBenchmark,
  createColumnBuilder,
  encodeSums,
  mergeSums,
  sumsLayout,
  sumsOfColumns,
} from '@cairn/metrics';
import { findRepoRoot } from '../../config/load-config.js';
import { decodeMeasureSet, MEASURE_SET_FOLDER } from '../../measure-sets/measure-sets.service.js';
import { peerShown, regionCount, regionRate } from './peer-disclosure.js';
import { decodeResult, encodeResult, RESULT_FORMAT, ResultBodyError } from './result-body.js';
import { trendDto } from './views.js';

describe('region figures on a practice’s page (disclosure applied)', () => {
  it.each([
    // region, own → shown
    [120, 30, { value: 120, display: '120' }],
    [0, 0, { value: 0, display: '0' }],
    [3, 3, { value: null, display: '< 5' }], // the region's count itself is small
    [4, 0, { value: null, display: '< 5' }],
    [33, 30, { value: null, display: 'withheld' }], // the rest of the region would be 3
    [34, 30, { value: null, display: 'withheld' }], // the rest would be 4
    [35, 30, { value: 35, display: '35' }], // the rest is 5
    [30, 30, { value: 30, display: '30' }], // the practice alone: nobody else revealed
  ])('count %i with %i of its own → %j', (region, own, expected) => {
    expect(regionCount(region, own, true)).toEqual(expected);
  });

  it('shows every count when the reader may see every practice', () => {
    expect(regionCount(3, 0, false)).toEqual({ value: 3, display: '3' });
    expect(regionCount(33, 30, false)).toEqual({ value: 33, display: '33' });
  });

  it.each([
    // events, n, own events, own n → rate or withheld (null)
    [60, 100, 10, 20, 0.6],
    [5, 9, 1, 2, null], // the region's denominator is under 10
    [30, 45, 25, 40, null], // the rest of the region: 5 of 5 — its denominator is under 10
    [30, 60, 27, 40, null], // the rest: 3 events of 20 — a count of 1–4
    [32, 60, 27, 40, 32 / 60], // the rest: 5 events of 20
    [18, 40, 18, 40, 18 / 40], // the practice alone
    [0, 0, 0, 0, null], // nothing to show
  ])('rate %i/%i with %i/%i of its own → %p', (events, n, ownEvents, ownN, expected) => {
    expect(regionRate(events, n, ownEvents, ownN, true)).toBe(expected);
  });

  it('shows every rate (n > 0) when the reader may see every practice', () => {
    expect(regionRate(5, 9, 1, 2, false)).toBe(5 / 9);
    expect(regionRate(0, 0, 0, 0, false)).toBeNull();
  });

  it.each([
    // events, n → shown as an unnamed point?
    [20, 40, true],
    [0, 40, true], // no events: nothing to reveal
    [3, 40, false], // 3 events could be read back from the rate
    [6, 9, false], // n under 10
    [0, 0, false], // nothing to plot
  ])('peer %i/%i → %p', (events, n, expected) => {
    expect(peerShown(events, n, true)).toBe(expected);
    expect(peerShown(events, n, false)).toBe(n > 0);
  });
});

describe('the stored form of a result', () => {
  const version = decodeMeasureSet(
    'cairn-default-2026.1.json',
    readFileSync(join(findRepoRoot(), MEASURE_SET_FOLDER, 'cairn-default-2026.1.json'), 'utf8'),
  );
  const layout = sumsLayout(version.compiled);
  const quarter = { year: 2026, quarter: 3 } as const;

  function contentOf(practices: number) {
    const codes = Array.from({ length: practices }, (_, p) => `P${String(p + 1).padStart(3, '0')}`);
    const builder = createColumnBuilder({ practiceCodes: codes });
    codes.forEach((code, p) => {
      for (let i = 0; i < 20 + p; i++) {
        builder.append({
          practiceCode: code,
          recordKey: `${code}-${i}`,
          birthYear: 1950 + (i % 40),
          sex: i % 2 ? 'F' : 'M',
          diabetesType: i % 9 === 0 ? 'type1' : 'type2',
          diagnosisYear: 2010,
          deprivationQuintile: ((i % 5) + 1) as 1 | 2 | 3 | 4 | 5,
          hba1c: i % 3 ? { month: '2026-03', mmolMol: 45 + (i % 20) } : null,
          bloodPressure: { month: '2026-01', systolic: 130, diastolic: 80 },
          cholesterol: null,
          serumCreatinine: null,
          urineAlbumin: null,
          footSurveillance: null,
          bmi: null,
          smoking: null,
          retinalScreening: null,
          onStatin: true,
          onInsulin: i % 9 === 0,
          insulinStartYear: i % 9 === 0 ? 2010 : null,
          cvdHistory: false,
        });
      }
    });
    const sums = sumsOfColumns(builder.finish(), layout, quarter);
    const list = codes.map((code) => ({ code, locality: null, sums: sums.get(code)! }));
    return {
      description: {
        quarterId: 7,
        measureSetId: version.id,
        practices: codes.map((code, p) => ({ code, submissionId: 100 + p })),
      },
      benchmark: buildBenchmark({ practices: list, measureSet: layout, quarter }),
      regionSums: mergeSums(list.map((p) => p.sums)),
    };
  }

  it('reads back what it stored, region sums included, the same bytes every time', () => {
    const content = contentOf(3);
    const body = encodeResult(content);
    expect(body.subarray(0, 4).toString('latin1')).toBe('CRBR');
    expect(encodeResult(content).equals(body)).toBe(true);
    const back = decodeResult(body, layout);
    expect(back.description).toEqual(content.description);
    expect(back.benchmark).toEqual(JSON.parse(JSON.stringify(content.benchmark)));
    expect(encodeSums(back.regionSums!)).toEqual(encodeSums(content.regionSums));
  });

  it('stores a large result as it is, and reads it back the same, compressed or not', () => {
    const content = contentOf(60);
    const body = encodeResult(content);
    expect(body[4]).toBe(2);
    expect(body[5]).toBe(0);
    expect(decodeResult(body, layout).benchmark).toEqual(
      JSON.parse(JSON.stringify(content.benchmark)),
    );
    // The same payload behind the gzip flag reads the same.
    const zipped = Buffer.concat([
      body.subarray(0, 5),
      Buffer.from([1]),
      gzipSync(body.subarray(6)),
    ]);
    expect(decodeResult(zipped, layout).benchmark).toEqual(
      JSON.parse(JSON.stringify(content.benchmark)),
    );
  });

  it('keeps the benchmark’s and the sums’ formats in its format number', () => {
    expect(RESULT_FORMAT).toBe(20_101);
  });

  it.each([
    ['bytes that are not a result', Buffer.from('hello there'), /not a stored benchmark result/],
    [
      'another container version',
      Buffer.from([0x43, 0x52, 0x42, 0x52, 9, 0, 0, 0]),
      /container version 9/,
    ],
    [
      'a truncated payload',
      Buffer.from([0x43, 0x52, 0x42, 0x52, 2, 0, 200, 0, 0, 0, 1]),
      /ends inside its description/,
    ],
  ])('refuses %s', (_what, bytes, message) => {
    expect(() => decodeResult(bytes, layout)).toThrow(ResultBodyError);
    expect(() => decodeResult(bytes, layout)).toThrow(message);
  });
});

describe('trends with gaps', () => {
  const at = (i: number) => ({
    year: 2025 + Math.floor(i / 4),
    quarter: ((i % 4) + 1) as 1 | 2 | 3 | 4,
  });

  it('leaves a quarter without a submission or without the measure as a gap, never a zero', () => {
    const dto = trendDto([
      { at: at(0), state: 'value', events: 5, n: 10 },
      { at: at(1), state: 'no-submission', events: 0, n: 0 },
      { at: at(2), state: 'not-in-measure-set', events: 0, n: 0 },
      { at: at(3), state: 'value', events: 8, n: 10 },
    ]);
    expect(dto.points.map((p) => [p.state, p.rate])).toEqual([
      ['value', 0.5],
      ['no-submission', null],
      ['not-in-measure-set', null],
      ['value', 0.8],
    ]);
    // The median of the two rates, not of four points with two zeros.
    expect(dto.signals.median).toBeCloseTo(0.65, 12);
    expect(dto.signals.usefulObservations).toBe(2);
  });

  it('finds a trend of five rising quarters and says where it is', () => {
    const dto = trendDto(
      [10, 20, 30, 40, 50, 60].map((events, i) => ({
        at: at(i),
        state: 'value' as const,
        events,
        n: 100,
      })),
    );
    expect(dto.signals.trends).toEqual([{ start: 0, end: 5, length: 6, direction: 'up' }]);
  });
});
