import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import fixture from '../../../test/fixtures/results-ov102-priya.json';
import detailFixture from '../../../test/fixtures/detail-ov102-priya.json';
import type { PracticeResults, PracticeResultsDetail } from '../../lib/api/types';
import { inSentence } from './ChartOrTable';
import { PeerStrip, peerStripText } from './PeerStrip';
import { TrendChart, TrendChartTable, trendChartText } from './TrendChart';
import { histogramRows, ValueHistogram, ValueHistogramTable } from './ValueHistogram';

const ov102 = fixture as unknown as PracticeResults;
const ov102Detail = detailFixture as unknown as PracticeResultsDetail;
const hba1c = ov102.measures.find((m) => m.measure.key === 'hba1c')!;
const all = hba1c.splits.find((s) => s.split === 'all')!;
const lowOutlier = { band: 'outlier', side: 'below', assessment: 'worse' } as const;
const noSignals = { median: null, tooFewRuns: false, tooManyRuns: false, shifts: [], trends: [] };

describe('PeerStrip', () => {
  const strip = {
    title: 'HbA1c recorded',
    own: { label: 'OV102', rate: all.own.rate, flag: all.own.exact },
    peers: all.peers,
    median: all.region.median,
  };

  it('draws every disclosed peer as an unnamed dot and the practice as its flag’s shape', () => {
    const { container } = render(<PeerStrip {...strip} />);
    expect(container.querySelectorAll('.cairn-peer-strip-peer')).toHaveLength(
      all.peers.rate.length,
    );
    expect(container.querySelectorAll('.cairn-peer-strip-own')).toHaveLength(1);
    // No peer is named anywhere in the drawing.
    expect(container.textContent).not.toMatch(/OV\d{3}/);
    expect(screen.getByRole('img').getAttribute('aria-label')).toBe(
      `HbA1c recorded: ${peerStripText(strip)}`,
    );
  });

  it('says where the practice sits, in words, and how many were left out', () => {
    const text = peerStripText({
      title: 'x',
      own: { label: 'OV201', rate: 0.5, flag: lowOutlier },
      peers: { rate: [0.4, 0.6, 0.7], withheld: 2 },
      median: 0.6,
    });
    expect(text).toBe(
      'OV201 50.0 % (outlier, worse): of 3 other practices shown (2 more left out under disclosure control), 2 higher and 1 lower; region median 60.0 %.',
    );
  });
});

describe('ValueHistogram', () => {
  const values = ov102Detail.detail!.values[0]!;
  const counts = values.splits.find((s) => s.split === 'all')!;
  const props = {
    label: values.label,
    unit: values.unit,
    edges: values.edges,
    practice: counts.practice,
    region: counts.region,
    practiceLabel: 'OV102',
  };

  it('names every band, from below the first edge to at or above the last', () => {
    const rows = histogramRows(props);
    expect(rows).toHaveLength(values.edges.length + 1);
    expect(rows[0]!.range).toBe(`below ${values.edges[0]} mmol/mol`);
    expect(rows[1]!.range).toBe(`${values.edges[0]} to under ${values.edges[1]} mmol/mol`);
    expect(rows.at(-1)!.range).toBe(`${values.edges.at(-1)} mmol/mol or more`);
  });

  it('draws the practice as bars and the region as a dashed outline, leaving withheld bins out', () => {
    const withheld = {
      ...props,
      region: {
        ...props.region,
        bins: props.region.bins.map((b, i) => (i === 30 ? { value: null, display: '< 5' } : b)),
      },
    };
    const { container } = render(<ValueHistogram {...withheld} />);
    const drawn = withheld.practice.bins.filter((b) => (b.value ?? 0) > 0).length;
    expect(container.querySelectorAll('.cairn-histogram-practice').length).toBeGreaterThanOrEqual(
      drawn,
    );
    const outline = container.querySelector('.cairn-histogram-region')!.getAttribute('d')!;
    expect(outline.length).toBeGreaterThan(0);
    render(<ValueHistogramTable {...withheld} />);
    // The table shows a withheld count as the API wrote it.
    expect(screen.getAllByText('< 5').length).toBeGreaterThan(0);
    expect(screen.getByRole('rowheader', { name: 'Not recorded' })).toBeTruthy();
  });
});

describe('TrendChart', () => {
  const points = [
    { label: '2026 Q1', rate: 0.6, events: 60, n: 100 },
    { label: '2026 Q2', rate: null, events: 0, n: 0, gap: 'no current submission' },
    { label: '2026 Q3', rate: 0.7, events: 70, n: 100 },
  ];

  it('leaves a gap open rather than drawing it as 0, and marks signalled quarters as squares', () => {
    const signals = {
      ...noSignals,
      median: 0.65,
      trends: [{ start: 0, end: 2, length: 3, direction: 'up' as const }],
    };
    const { container } = render(<TrendChart title="HbA1c" points={points} signals={signals} />);
    expect(container.querySelectorAll('.cairn-trend-signal')).toHaveLength(2);
    expect(container.querySelectorAll('.cairn-trend-point')).toHaveLength(0);
    // Two separate pieces of line: M…M, the gap between them.
    const d = container.querySelector('.cairn-trend-line')!.getAttribute('d')!;
    expect(d.match(/M/g)).toHaveLength(2);
    expect(screen.getByRole('img').getAttribute('aria-label')).toContain(
      '2 quarters with figures, 2026 Q1 60.0 % to 2026 Q3 70.0 %. Trend upward',
    );
  });

  it('has a table alternative that says why a quarter has no figure', () => {
    render(<TrendChartTable title="HbA1c" points={points} signals={noSignals} />);
    expect(screen.getByRole('table', { name: 'HbA1c: figures' })).toBeTruthy();
    expect(screen.getByText('no current submission')).toBeTruthy();
    expect(trendChartText({ title: 'x', points, signals: noSignals })).toMatch(
      /No run-chart signal\.$/,
    );
  });
});

describe('a chart’s table switch', () => {
  it.each([
    ['Time to insulin', 'time to insulin'],
    ['Funnel plot', 'funnel plot'],
    ['HbA1c', 'HbA1c'],
    ['BMI', 'BMI'],
    ['eGFR (CKD-EPI 2021)', 'eGFR (CKD-EPI 2021)'],
    ['Systolic blood pressure', 'systolic blood pressure'],
  ])('reads “%s” as “%s” inside its sentence', (label, words) => {
    expect(inSentence(label)).toBe(words);
  });
});
