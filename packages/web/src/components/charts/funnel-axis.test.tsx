import { render } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import fixture from '../../../test/fixtures/funnel-q8-hba1c.json';
import type { MeasureFunnel } from '../../lib/api/types';
import { FunnelPlot, funnelRateDomain } from './FunnelPlot';

const funnel = fixture as unknown as MeasureFunnel & {
  curves: NonNullable<MeasureFunnel['curves']>;
  region: NonNullable<MeasureFunnel['region']>;
};
const limits = funnel.curves.exact;
const points = funnel.points.map((p) => ({ n: p.n, rate: p.rate! }));

describe('the funnel plot’s rate axis', () => {
  it('covers every point, the region rate and the limits, with round ends', () => {
    const [lo, hi] = funnelRateDomain(points, funnel.curves.n, limits, funnel.region.theta0);
    const lowest = Math.min(...points.map((p) => p.rate));
    // OV201 in the demo region sits near 53 %: the axis starts at a round value below it.
    expect(lowest).toBeLessThan(0.54);
    expect(lo).toBeLessThanOrEqual(lowest);
    expect(hi).toBeGreaterThanOrEqual(Math.max(...points.map((p) => p.rate)));
    expect(hi).toBeLessThanOrEqual(1);
    expect(Math.round(lo * 100) % 5).toBe(0);
    expect(Math.round(hi * 100) % 5).toBe(0);
  });

  it('keeps within 0–100 % and copes with one point or none', () => {
    const one = funnelRateDomain(
      [{ n: 40, rate: 1 }],
      [],
      { innerLower: [], innerUpper: [], outerLower: [], outerUpper: [] },
      null,
    );
    expect(one[0]).toBeGreaterThanOrEqual(0);
    expect(one[1]).toBe(1);
    expect(one[0]).toBeLessThan(1);
    expect(
      funnelRateDomain(
        [],
        [],
        { innerLower: [], innerUpper: [], outerLower: [], outerUpper: [] },
        null,
      ),
    ).toEqual([0, 1]);
  });

  it('draws a labelled tick below the lowest point', () => {
    const { container } = render(
      <FunnelPlot
        title="HbA1c"
        points={funnel.points.map((p) => ({
          id: p.practice.id,
          label: p.practice.code,
          n: p.n,
          events: p.events,
          rate: p.rate!,
          flag: p.exact,
        }))}
        curveN={funnel.curves.n}
        limits={limits}
        target={funnel.region.theta0}
      />,
    );
    const ticks = [...container.querySelectorAll('.cairn-chart-axis g text')]
      .map((t) => t.textContent ?? '')
      .filter((t) => t.endsWith('%'))
      .map((t) => Number.parseFloat(t) / 100);
    expect(Math.min(...ticks)).toBeLessThanOrEqual(Math.min(...points.map((p) => p.rate)));
    expect(Math.max(...ticks)).toBeGreaterThanOrEqual(Math.max(...points.map((p) => p.rate)));
  });
});
