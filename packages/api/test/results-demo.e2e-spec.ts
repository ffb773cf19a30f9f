/**
 * The results of the demo region (Ostrevale: eight quarters of invented
 * extracts, loaded through the upload pipeline) checked against things
 * outside Cairn's own code:
 *
 * - per-practice counts of three measures of 2026 Q3 (HbA1c recorded, blood
 *   pressure recorded, HbA1c 53 mmol/mol or below) recomputed by plain SQL over
 *   care_records from the definitions of docs/methods.md §1–3, against the API;
 * - the funnel limits and the over-dispersion of one measure recomputed from
 *   jstat (a general-purpose statistics library from the npm registry): exact
 *   binomial limits with interpolation (Spiegelhalter, Stat Med 2005;24:1185–202)
 *   from jstat's binomial distribution function, φ from Winsorised z-scores
 *   (Hyndman & Fan type 7 percentiles, worked here), the χ²(I − 1) 95 % point
 *   from jstat's χ² quantile, τ² (Spiegelhalter et al., JRSS A 2012;175:1–47);
 * - the demo scenario's story: the improving practice (OV102) shows an upward
 *   run-chart trend, the persistently low one (OV201) is flagged low, the one
 *   with implausible data (OV205) shows data-quality flags, and the one that has
 *   not submitted this quarter (OV303) is missing, not zero.
 */
import jStat from 'jstat';
import { QueryTypes } from 'sequelize';
import { loadDemoRegion } from './support/demo-region.js';
import { demoIds, signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

interface Cell {
  measure: string;
  n: number;
  events: number;
  exact: { band: string | null; side: string | null; assessment: string | null };
  adjusted: { band: string | null; side: string | null; assessment: string | null };
}
interface Row {
  practice: { id: number; code: string };
  cells: Cell[];
  dataQuality: { code: string; count: number }[];
}

/** Spiegelhalter's interpolated exact binomial limit for tail probability p, from jstat. */
function jstatLimit(p: number, n: number, theta0: number): number {
  let r = 0;
  while (jStat.binomial.cdf(r, n, theta0) < p) r++;
  const cdf = jStat.binomial.cdf(r, n, theta0);
  const below = r > 0 ? jStat.binomial.cdf(r - 1, n, theta0) : 0;
  const alpha = cdf - below > 0 ? (cdf - p) / (cdf - below) : 0;
  return Math.min(1, Math.max(0, (r - alpha) / n));
}

/**
 * The API sends every non-integer to six significant figures (docs/methods.md §10): a figure
 * sent is within half a unit of its sixth figure of the value checked (plus `slack`, the
 * checking library's own error).
 */
function expectSixFigures(sent: number, value: number, slack = 1e-12): void {
  expect(Math.abs(sent - value)).toBeLessThanOrEqual(5e-6 * Math.abs(value) + slack);
}

/** Hyndman & Fan type 7 percentile of sorted values. */
function percentile(sorted: number[], q: number): number {
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

describe('the demo region’s results, checked from outside', () => {
  let t: TestApp;
  let regional: SignedInAgent;
  let q3: number;
  let rows: Row[];
  let table: { body: Record<string, unknown> };

  beforeAll(async () => {
    t = await createTestApp({
      prepare: async (config, secrets, db) => {
        await loadDemoRegion(config, secrets, db);
      },
    });
    regional = await signInAs(t, 'regional_lead');
    const [q] = await t.db.query<{ id: number }>(
      'SELECT id FROM audit_quarters WHERE year = 2026 AND quarter = 3',
      { type: QueryTypes.SELECT },
    );
    q3 = Number(q!.id);
    table = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
    rows = table.body.practices as Row[];
  }, 900_000);
  afterAll(async () => {
    await t?.close();
  });

  const cellOf = (code: string, measure: string): Cell =>
    rows.find((r) => r.practice.code === code)!.cells.find((c) => c.measure === measure)!;

  it('counts three measures per practice as plain SQL over the records does', async () => {
    // Eligible: a known diabetes type and aged 12 or more at the end of the review window
    // (2026 − birth year); the review window of 2026 Q3 is 2025-10 … 2026-09 (methods §1).
    const eligible = 'r.diabetes_type IS NOT NULL AND 2026 - r.birth_year >= 12';
    const hba1c = "r.hba1c_month BETWEEN '2025-10' AND '2026-09' AND r.hba1c_mmol_mol IS NOT NULL";
    const sql = await t.db.query<{
      code: string;
      eligible: number;
      hba1c: number;
      bp: number;
      le53: number;
    }>(
      `SELECT p.code,
              SUM(${eligible}) AS eligible,
              SUM(${eligible} AND ${hba1c}) AS hba1c,
              SUM(${eligible} AND r.blood_pressure_month BETWEEN '2025-10' AND '2026-09'
                  AND r.systolic IS NOT NULL AND r.diastolic IS NOT NULL) AS bp,
              SUM(${eligible} AND ${hba1c} AND r.hba1c_mmol_mol <= 53) AS le53
         FROM practice_quarters pq
         JOIN practices p ON p.id = pq.practice_id
         JOIN care_records r ON r.submission_id = pq.current_submission_id
        WHERE pq.quarter_id = ?
        GROUP BY p.code ORDER BY p.code`,
      { replacements: [q3], type: QueryTypes.SELECT },
    );
    expect(sql.map((r) => r.code)).toEqual(rows.map((r) => r.practice.code));
    expect(sql.length).toBe(29);
    for (const r of sql) {
      const api = {
        hba1c: cellOf(r.code, 'hba1c'),
        bp: cellOf(r.code, 'blood_pressure'),
        le53: cellOf(r.code, 'hba1c_le_53'),
      };
      expect([api.hba1c.n, api.hba1c.events]).toEqual([Number(r.eligible), Number(r.hba1c)]);
      expect([api.bp.n, api.bp.events]).toEqual([Number(r.eligible), Number(r.bp)]);
      expect([api.le53.n, api.le53.events]).toEqual([Number(r.eligible), Number(r.le53)]);
    }
  });

  it('draws the funnel limits and over-dispersion that jstat gives', async () => {
    const res = await regional
      .get(`/api/quarters/${q3}/benchmark/measures/hba1c_le_53`)
      .expect(200);
    const points = res.body.points as {
      n: number;
      events: number;
      exact: { inner: { lower: number; upper: number }; outer: { lower: number; upper: number } };
    }[];
    const theta0 = points.reduce((s, p) => s + p.events, 0) / points.reduce((s, p) => s + p.n, 0);
    expectSixFigures(res.body.region.theta0, theta0);
    for (const p of points) {
      expectSixFigures(p.exact.inner.lower, jstatLimit(0.025, p.n, theta0));
      expectSixFigures(p.exact.inner.upper, jstatLimit(0.975, p.n, theta0));
      expectSixFigures(p.exact.outer.lower, jstatLimit(0.001, p.n, theta0));
      expectSixFigures(p.exact.outer.upper, jstatLimit(0.999, p.n, theta0));
    }
    const s2 = (n: number) => (theta0 * (1 - theta0)) / n;
    const z = points.map((p) => (p.events / p.n - theta0) / Math.sqrt(s2(p.n)));
    const sorted = [...z].sort((a, b) => a - b);
    const lo = percentile(sorted, 0.1);
    const hi = percentile(sorted, 0.9);
    const I = z.length;
    const phi = z.reduce((s, v) => s + Math.min(hi, Math.max(lo, v)) ** 2, 0) / I;
    const od = res.body.overdispersion;
    expectSixFigures(od.phi, phi);
    expectSixFigures(od.statistic, I * phi);
    expectSixFigures(od.critical, jStat.chisquare.inv(0.95, I - 1), 1e-6);
    expect(od.present).toBe(I * phi > jStat.chisquare.inv(0.95, I - 1));
    const w = points.map((p) => 1 / s2(p.n));
    const sw = w.reduce((a, b) => a + b, 0);
    const sw2 = w.reduce((a, b) => a + b * b, 0);
    const tau2 = Math.max(0, (I * phi - (I - 1)) / (sw - sw2 / sw));
    expectSixFigures(od.tau2, tau2);
  });

  it('shows the improving practice’s upward run-chart trend', async () => {
    const ids = await demoIds(t);
    const res = await regional
      .get(`/api/practices/${ids.practice('OV102')}/quarters/${q3}/results`)
      .expect(200);
    expect(res.body.quarters).toHaveLength(8);
    const rising = (
      res.body.measures as {
        measure: { key: string };
        splits: { split: string; trend: { signals: { trends: { direction: string }[] } } }[];
      }[]
    )
      .filter((m) =>
        m.splits.some(
          (s) => s.split === 'all' && s.trend.signals.trends.some((x) => x.direction === 'up'),
        ),
      )
      .map((m) => m.measure.key);
    expect(rising).toEqual(expect.arrayContaining(['hba1c', 'foot_surveillance']));
    const trend = await regional
      .get(`/api/quarters/${q3}/benchmark/trend`)
      .query({ measure: 'foot_surveillance' })
      .expect(200);
    const own = trend.body.practices.find(
      (p: { practice: { code: string } }) => p.practice.code === 'OV102',
    );
    expect(own.trend.signals.trends).toEqual([
      expect.objectContaining({ direction: 'up', end: 7 }),
    ]);
  });

  it('flags the persistently low practice low on the care processes', () => {
    for (const measure of ['hba1c', 'foot_surveillance', 'retinal_screening', 'all_processes']) {
      const cell = cellOf('OV201', measure);
      expect(cell.exact).toMatchObject({ side: 'below', assessment: 'worse' });
      expect(cell.adjusted).toMatchObject({ side: 'below', assessment: 'worse' });
      expect(['notable', 'outlier']).toContain(cell.adjusted.band);
    }
  });

  it('shows the data-quality flags of the practice with implausible data', () => {
    const flags = rows.find((r) => r.practice.code === 'OV205')!.dataQuality;
    expect(flags.find((f) => f.code === 'type1_not_on_insulin')!.count).toBeGreaterThan(0);
    expect(flags.find((f) => f.code === 'diagnostic_below_threshold')!.count).toBeGreaterThan(0);
  });

  it('shows the practice that has not submitted as missing, not as zero', async () => {
    expect(rows.map((r) => r.practice.code)).not.toContain('OV303');
    const coverage = table.body.coverage as { missing: { code: string }[] };
    expect(coverage.missing.map((p) => p.code)).toEqual(['OV303']);
    const ids = await demoIds(t);
    const res = await regional
      .get(`/api/practices/${ids.practice('OV303')}/quarters/${q3}/results`)
      .expect(200);
    expect(res.body.state).toBe('no-current-submission');
    const trend = await regional
      .get(`/api/quarters/${q3}/benchmark/trend`)
      .query({ measure: 'hba1c' })
      .expect(200);
    const points = trend.body.practices.find(
      (p: { practice: { code: string } }) => p.practice.code === 'OV303',
    ).trend.points;
    expect(points[7]).toEqual({ state: 'no-submission', events: 0, n: 0, rate: null });
    expect(points.slice(0, 7).every((p: { state: string }) => p.state === 'value')).toBe(true);
  });
});
