import jStat from 'jstat';
import { beforeAll, describe, expect, it } from 'vitest';
import { syntheticColumns, syntheticLocalities } from '../../bench/synthetic.js';
import { defaultMeasureSet, defaultMeasureSetJson } from '../../test/measure-set.js';
import { record } from '../../test/records.js';
import { TYPE_SPLITS, type TypeSplit } from '../measures/compile.js';
import { evaluateRecords } from '../measures/evaluate-records.js';
import { aggregateAt, caseMixRatios, type EvaluationResult } from '../measures/result.js';
import { parseMeasureSet } from '../measures/schema.js';
import { insulinProgression } from '../progression/insulin.js';
import { recordAt, toColumns } from '../records/columns.js';
import type { CareRecord } from '../records/record.js';
import { funnelFlag } from '../stats/funnel-flag.js';
import { funnelLimits } from '../stats/funnel-limits.js';
import { improvementPotential } from '../stats/improvement-potential.js';
import { overdispersion } from '../stats/overdispersion.js';
import { median } from '../stats/run-chart.js';
import { mergeSums } from '../sums/merge-sums.js';
import type { PracticeSums } from '../sums/practice-sums.js';
import { sumsOfColumns } from '../sums/sums-of-columns.js';
import type { Benchmark } from './benchmark.js';
import {
  benchmarkMeasure,
  benchmarkPractice,
  benchmarkRecords,
  benchmarkTable,
} from './benchmark-views.js';
import { buildBenchmark } from './build-benchmark.js';

/**
 * The benchmark built from sums against the plain reference (`evaluateRecords`) and against the
 * statistics functions it composes, on an invented region of 30 practices (bench/synthetic.ts,
 * whose practices differ in quality, so the care processes are over-dispersed).
 */
const set = defaultMeasureSet();
const quarter = { year: 2026, quarter: 3 } as const;
const PRACTICES = 30;

let records: CareRecord[];
let sums: Map<string, PracticeSums>;
let benchmark: Benchmark;
let plain: EvaluationResult;
const localities = syntheticLocalities(PRACTICES, 4);

beforeAll(() => {
  const columns = syntheticColumns({
    records: 9_000,
    practices: PRACTICES,
    seed: 2026,
    endMonthIndex: 2026 * 12 + 8,
  });
  records = Array.from({ length: columns.length }, (_, i) => recordAt(columns, i));
  sums = sumsOfColumns(columns, set, quarter);
  benchmark = buildBenchmark({
    practices: [...sums].map(([code, s]) => ({ code, locality: localities.get(code), sums: s })),
    measureSet: set,
    quarter,
  });
  plain = evaluateRecords(records, set, quarter, { localities }).result;
});

const splits = TYPE_SPLITS as readonly TypeSplit[];

describe('buildBenchmark against the plain reference', () => {
  it('has every practice’s and locality’s counts, and the region’s θ₀', () => {
    expect(benchmark.practices).toEqual(plain.practices);
    expect(benchmark.localities).toEqual(plain.localities);
    benchmark.measures.forEach((measure, m) => {
      for (const split of splits) {
        for (const level of ['practice', 'locality'] as const) {
          const view = benchmarkMeasure(benchmark, measure.key, split, level);
          const offset = level === 'practice' ? 0 : plain.practices.length;
          view.units.forEach((unit, i) => {
            const a = aggregateAt(plain, offset + i, split, 0, m);
            expect([unit.events, unit.n, unit.denominator, unit.measured]).toEqual([
              a.events,
              a.n,
              a.denominator,
              a.measured,
            ]);
          });
        }
        const region = aggregateAt(
          plain,
          plain.practices.length + plain.localities.length,
          split,
          0,
          m,
        );
        const comparison = benchmarkMeasure(benchmark, measure.key, split).comparison;
        expect([comparison.events, comparison.n]).toEqual([region.events, region.n]);
        expect(comparison.theta0).toBe(region.rate);
      }
    });
    const total = plain.records[(plain.practices.length + plain.localities.length) * 4];
    expect(benchmark.records.total).toBe(total);
  });

  // evaluateRecords adds each record's stratum rate to its practice's E one record at a time;
  // the sums multiply each stratum's n by its rate. Both are Σ n·r, rounded differently, so
  // they agree to the last few bits, not bit for bit.
  it('has the case-mix E, O/E and adjusted rate of evaluateRecords (to rounding)', () => {
    for (const measure of benchmark.measures) {
      for (const split of splits) {
        const reference = caseMixRatios(plain, measure.key, { split });
        const view = benchmarkMeasure(benchmark, measure.key, split);
        let sumO = 0;
        let sumE = 0;
        view.units.forEach((unit, i) => {
          const r = reference[i] as (typeof reference)[number];
          expect(unit.caseMix.observed).toBe(r.observed);
          expect(Math.abs(unit.caseMix.expected - r.expected)).toBeLessThanOrEqual(
            1e-9 * Math.max(1, r.expected),
          );
          if (r.ratio === null) expect(unit.caseMix.ratio).toBeNull();
          else {
            expect(unit.caseMix.ratio).toBeCloseTo(r.ratio, 9);
            expect(unit.caseMix.interval.lower).toBeCloseTo(r.interval.lower as number, 9);
            expect(unit.caseMix.interval.upper).toBeCloseTo(r.interval.upper as number, 9);
            expect(unit.caseMix.adjustedRate).toBeCloseTo(r.adjustedRate as number, 9);
          }
          sumO += unit.caseMix.observed;
          sumE += unit.caseMix.expected;
        });
        // Indirect standardisation: Σ O = Σ E over the region (docs/methods.md §8).
        expect(Math.abs(sumO - sumE)).toBeLessThan(1e-8 * Math.max(1, sumO));
      }
    }
  });
});

describe('buildBenchmark against the statistics it composes', () => {
  it('flags every practice as funnelFlag does, with and without over-dispersion', () => {
    let adjustedDiffer = 0;
    for (const measure of benchmark.measures) {
      for (const split of splits) {
        const view = benchmarkMeasure(benchmark, measure.key, split);
        const theta0 = view.comparison.theta0 as number;
        const units = view.units.map((u) => ({ events: u.events, n: u.n }));
        const od = overdispersion(units, theta0);
        const summary = view.comparison.practice.overdispersion;
        expect(summary).toEqual({
          phi: od.phi,
          tau2: od.tau2,
          present: od.present,
          statistic: od.statistic,
          critical: od.critical,
          bounds: od.bounds,
        });
        view.units.forEach((unit, i) => {
          const exact = funnelFlag(unit, theta0, { direction: measure.direction });
          const adjusted = funnelFlag(unit, theta0, {
            direction: measure.direction,
            overdispersion: od,
            method: 'additive',
          });
          expect(unit.exact).toEqual({
            band: exact.band,
            side: exact.side,
            assessment: exact.assessment,
            inner: exact.inner,
            outer: exact.outer,
          });
          expect(unit.adjusted).toEqual({
            band: adjusted.band,
            side: adjusted.side,
            assessment: adjusted.assessment,
            inner: adjusted.inner,
            outer: adjusted.outer,
          });
          if (unit.adjusted.band !== unit.exact.band) adjustedDiffer++;
          expect(unit.z).toBe(od.z[i]);
        });
      }
    }
    // The synthetic practices differ in quality: some flags change once limits widen.
    expect(adjustedDiffer).toBeGreaterThan(0);
  });

  it('takes the median of practice rates and the improvement potential towards it', () => {
    for (const measure of benchmark.measures) {
      const view = benchmarkMeasure(benchmark, measure.key, 'all');
      const rates = view.units.filter((u) => u.n > 0).map((u) => u.events / u.n);
      const m = median(rates) as number;
      expect(view.comparison.practice.median).toBe(m);
      for (const unit of view.units) {
        expect(unit.improvementPotential).toBe(
          improvementPotential(unit.events, unit.n, m, measure.direction),
        );
      }
    }
  });

  // Reference: jstat (a general-purpose statistics library from the registry). The exact limit
  // (Spiegelhalter 2005) recomputed from jstat's binomial CDF: r_p by a search of the CDF, α by
  // interpolation, limit (r_p − α)/n.
  it('draws exact funnel limits that agree with jstat’s binomial CDF', () => {
    const reference = (p: number, n: number, theta: number): number => {
      let r = 0;
      while (jStat.binomial.cdf(r, n, theta) < p) r++;
      const f = jStat.binomial.cdf(r, n, theta);
      const below = r > 0 ? jStat.binomial.cdf(r - 1, n, theta) : 0;
      return Math.min(1, Math.max(0, (r - (f - p) / (f - below)) / n));
    };
    let worst = 0;
    for (const key of ['hba1c', 'bp_target', 'statin_40_75']) {
      const view = benchmarkMeasure(benchmark, key, 'type2_other');
      const theta0 = view.comparison.theta0 as number;
      for (const unit of view.units) {
        const { inner, outer } = unit.exact;
        worst = Math.max(
          worst,
          Math.abs((inner.lower as number) - reference(0.025, unit.n, theta0)),
          Math.abs((inner.upper as number) - reference(0.975, unit.n, theta0)),
          Math.abs((outer.lower as number) - reference(0.001, unit.n, theta0)),
          Math.abs((outer.upper as number) - reference(0.999, unit.n, theta0)),
        );
      }
      // The curves for drawing: the same limits over a grid spanning the practices' n.
      const curves = view.comparison.practice.curves!;
      curves.n.forEach((n, i) => {
        const limits = funnelLimits(theta0, n, 0.95);
        expect(curves.exact.innerLower[i]).toBe(Math.round((limits.lower as number) * 1e6) / 1e6);
        expect(curves.exact.innerUpper[i]).toBe(Math.round((limits.upper as number) * 1e6) / 1e6);
      });
      const ns = view.units.map((u) => u.n).filter((n) => n > 0);
      expect(curves.n[0]).toBe(Math.min(...ns));
      expect(curves.n[curves.n.length - 1]).toBe(Math.max(...ns));
    }
    // jstat's binomial CDF is accurate to about 1e-10, which moves a limit by up to ~1e-9.
    expect(worst).toBeLessThan(1e-8);
  });

  // Reference: jstat. φ recomputed from the z-scores with jstat's inclusive percentile (the
  // Hyndman & Fan type 7 that Spiegelhalter's Winsorising uses) and the χ²(I − 1) 95 % point.
  it('estimates φ and the χ² test as a jstat recomputation does', () => {
    for (const key of ['hba1c', 'retinal_screening', 'all_processes', 'hba1c_le_53']) {
      const view = benchmarkMeasure(benchmark, key, 'all');
      const theta0 = view.comparison.theta0 as number;
      const z = view.units.map(
        (u) => (u.events / u.n - theta0) / Math.sqrt((theta0 * (1 - theta0)) / u.n),
      );
      const lower = jStat.percentile(z, 0.1);
      const upper = jStat.percentile(z, 0.9);
      const phi = z.reduce((s, v) => s + Math.min(upper, Math.max(lower, v)) ** 2, 0) / z.length;
      const od = view.comparison.practice.overdispersion!;
      expect(od.phi).toBeCloseTo(phi, 10);
      expect(od.critical).toBeCloseTo(jStat.chisquare.inv(0.95, z.length - 1), 8);
      expect(od.present).toBe(z.length * phi > jStat.chisquare.inv(0.95, z.length - 1));
    }
  });

  // Reference: jstat's χ² quantile, Garwood's interval for a Poisson count O:
  // χ²(2O; α/2)/2 … χ²(2(O + 1); 1 − α/2)/2.
  it('stores Garwood intervals that agree with jstat', () => {
    benchmark.poisson.observed.forEach((o, i) => {
      const lower = o === 0 ? 0 : jStat.chisquare.inv(0.025, 2 * o) / 2;
      const upper = jStat.chisquare.inv(0.975, 2 * (o + 1)) / 2;
      expect(Math.abs((benchmark.poisson.lower[i] as number) - lower)).toBeLessThan(
        1e-8 * Math.max(1, lower),
      );
      expect(Math.abs((benchmark.poisson.upper[i] as number) - upper)).toBeLessThan(1e-8 * upper);
    });
  });

  it('gives the region’s time to insulin as progression/insulin.ts does', () => {
    const reference = insulinProgression(records, quarter, { minAge: 12 });
    expect(benchmark.progression).toEqual({
      n: reference.region.n,
      events: reference.region.events,
      excluded: reference.excluded,
      median: reference.region.median,
    });
    expect(mergeSums([...sums.values()]).insulin.excluded).toBe(reference.excluded);
  });
});

describe('benchmark storage and views', () => {
  it('survives JSON and stays a few hundred kB here', () => {
    const text = JSON.stringify(benchmark);
    const parsed = JSON.parse(text) as Benchmark;
    expect(parsed).toEqual(benchmark);
    expect(benchmarkMeasure(parsed, 'bp_target', 'type1')).toEqual(
      benchmarkMeasure(benchmark, 'bp_target', 'type1'),
    );
    expect(text.length).toBeLessThan(400_000);
  });

  it('reads one practice across every measure as the measure views do', () => {
    const code = benchmark.practices[7] as string;
    const view = benchmarkPractice(benchmark, code);
    expect(view.results).toHaveLength(benchmark.measures.length * 3);
    expect(view.locality).toBe(localities.get(code));
    for (const r of view.results) {
      const unit = benchmarkMeasure(benchmark, r.measure.key, r.split).units[7];
      expect(r.unit).toEqual(unit);
    }
    const table = benchmarkTable(benchmark, 'all');
    const row = table.units[7]!;
    benchmark.measures.forEach((measure, m) => {
      const unit = benchmarkMeasure(benchmark, measure.key, 'all').units[7]!;
      expect([row.n[m], row.events[m], row.rate[m]]).toEqual([unit.n, unit.events, unit.rate]);
    });
  });

  it('reads every practice’s record counts as the practice view does', () => {
    const all = benchmarkRecords(benchmark);
    expect(all.map((r) => r.code)).toEqual(benchmark.practices);
    for (const code of [benchmark.practices[0]!, benchmark.practices[7]!]) {
      const { code: own, ...records } = all.find((r) => r.code === code)!;
      expect(own).toBe(code);
      expect(records).toEqual(benchmarkPractice(benchmark, code).records);
    }
    const total = all.reduce((n, r) => n + r.total, 0);
    expect(total).toBe(benchmark.records.total);
  });

  it('refuses unknown measures, practices, splits and formats', () => {
    expect(() => benchmarkMeasure(benchmark, 'nope')).toThrow(/measure "nope" is not in/);
    expect(() => benchmarkMeasure(benchmark, 'hba1c', 'type3' as TypeSplit)).toThrow(/split/);
    expect(() => benchmarkPractice(benchmark, 'P99999')).toThrow(/P99999 is not in/);
    expect(() => benchmarkMeasure({ ...benchmark, format: 2 as 1 }, 'hba1c')).toThrow(/format 2/);
  });
});

describe('buildBenchmark refuses bad input', () => {
  const one = (): PracticeSums =>
    [...sumsOfColumns(toColumns([record()]), set, quarter).values()][0] as PracticeSums;

  it('names a practice listed twice, or with sums of another quarter or measure set', () => {
    const s = one();
    expect(() =>
      buildBenchmark({
        practices: [
          { code: 'P1', sums: s },
          { code: 'P1', sums: s },
        ],
        measureSet: set,
        quarter,
      }),
    ).toThrow(/P1 is listed twice/);
    expect(() =>
      buildBenchmark({
        practices: [{ code: 'P7', sums: s }],
        measureSet: set,
        quarter: { year: 2026, quarter: 4 },
      }),
    ).toThrow(/sums of practice P7 are for 2026 Q3, not 2026 Q4/);
    const json = defaultMeasureSetJson();
    json.id = 'cairn-default-2026.2';
    expect(() =>
      buildBenchmark({
        practices: [{ code: 'P7', sums: s }],
        measureSet: parseMeasureSet(json),
        quarter,
      }),
    ).toThrow(/sums of practice P7 were made under measure set cairn-default-2026\.1/);
    expect(() =>
      buildBenchmark({ practices: [{ code: '', sums: s }], measureSet: set, quarter }),
    ).toThrow(/code must be a non-empty string/);
    expect(() =>
      buildBenchmark({
        practices: [{ code: 'P1', sums: s }],
        measureSet: set,
        quarter,
        options: { curvePoints: 1 },
      }),
    ).toThrow(/curvePoints/);
  });

  it('builds an empty region without statistics', () => {
    const empty = buildBenchmark({ practices: [], measureSet: set, quarter });
    expect(empty.comparisons[0]?.theta0).toBeNull();
    expect(benchmarkMeasure(empty, 'hba1c').units).toEqual([]);
  });
});
