import { fireEvent, render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { ChartOrTable } from './ChartOrTable';
import { FlagMark } from './FlagMark';
import { flagKind, flagShortText, flagText } from './flags';
import { FunnelPlot } from './FunnelPlot';
import { IntervalBar } from './IntervalBar';
import { RunSparkline } from './RunSparkline';
import { signalSentences } from './run-signals';
import { SurvivalChart } from './SurvivalChart';

const within = { band: 'within', side: null, assessment: null } as const;
const lowOutlier = { band: 'outlier', side: 'below', assessment: 'worse' } as const;
const highNotable = { band: 'notable', side: 'above', assessment: 'better' } as const;
const noSignals = { median: null, tooFewRuns: false, tooManyRuns: false, shifts: [], trends: [] };

describe('flags', () => {
  it.each([
    [within, 'within', 'Within limits'],
    [lowOutlier, 'outlier-worse', 'Outlier, worse'],
    [highNotable, 'notable-better', 'Notable, better'],
    [{ band: null, side: null, assessment: null }, 'none', 'Not assessed'],
  ] as const)('%o is %s, "%s"', (flag, kind, words) => {
    expect(flagKind(flag)).toBe(kind);
    expect(flagShortText(flag)).toBe(words);
  });

  it('says the side, the limit and whether it is good news', () => {
    expect(flagText(lowOutlier)).toBe('Outlier: below the 99.8 % limit (worse than the region)');
    expect(flagText(highNotable)).toBe('Notable: above the 95 % limit (better than the region)');
  });

  it('draws a shape and words, not colour alone', () => {
    const { container } = render(<FlagMark flag={lowOutlier} />);
    expect(screen.getByText('Outlier, worse')).toBeTruthy();
    // A filled triangle pointing down
    const path = container.querySelector('path')!;
    expect(path.getAttribute('d')).toMatch(/^M 0 6 L/);
    expect(path.getAttribute('fill')).toBe('var(--cairn-worse)');
  });
});

describe('IntervalBar', () => {
  it('names the rate, its interval and the region median', () => {
    render(<IntervalBar rate={0.72} lower={0.65} upper={0.78} median={0.7} />);
    expect(
      screen.getByRole('img', {
        name: '72.0 % (95 % interval 65.0 % to 78.0 %); region median 70.0 %',
      }),
    ).toBeTruthy();
  });

  it('says when the median is withheld and draws no tick', () => {
    const { container } = render(<IntervalBar rate={0.5} lower={0.4} upper={0.6} median={null} />);
    expect(screen.getByRole('img').getAttribute('aria-label')).toContain('region median withheld');
    expect(container.querySelector('.cairn-chart-median')).toBeNull();
  });
});

describe('RunSparkline', () => {
  const points = [
    { label: '2025 Q1', rate: 0.5 },
    { label: '2025 Q2', rate: null },
    { label: '2025 Q3', rate: 0.55 },
    { label: '2025 Q4', rate: 0.6 },
    { label: '2026 Q1', rate: 0.65 },
    { label: '2026 Q2', rate: 0.7 },
  ];
  const signals = {
    median: 0.6,
    tooFewRuns: false,
    tooManyRuns: false,
    shifts: [],
    trends: [{ start: 2, end: 5, length: 4, direction: 'up' as const }],
  };

  it('marks the points of a trend as squares and leaves gaps undrawn', () => {
    const { container } = render(<RunSparkline points={points} signals={signals} />);
    expect(container.querySelectorAll('rect.cairn-sparkline-signal')).toHaveLength(4);
    expect(container.querySelectorAll('circle.cairn-sparkline-point')).toHaveLength(1);
    // The line breaks at the gap: two move-to commands
    const d = container.querySelector('path.cairn-sparkline-line')!.getAttribute('d')!;
    expect(d.match(/M/g)).toHaveLength(2);
  });

  it('says the first and last values and the signal in words', () => {
    render(<RunSparkline points={points} signals={signals} />);
    expect(screen.getByRole('img').getAttribute('aria-label')).toBe(
      '5 quarters, 2025 Q1 50.0 % to 2026 Q2 70.0 %. Trend upward: 4 points in a row rising, 2025 Q3 to 2026 Q2',
    );
  });

  it('words shifts and runs', () => {
    expect(
      signalSentences(
        {
          ...noSignals,
          tooFewRuns: true,
          shifts: [{ start: 0, end: 5, length: 6, side: 'below' }],
        },
        ['a', 'b', 'c', 'd', 'e', 'f'],
      ),
    ).toEqual([
      'Shift below the median: 6 points in a row, a to f',
      'Too few runs: the rate has moved away from its median',
    ]);
  });
});

describe('FunnelPlot', () => {
  const curveN = [1, 50, 100, 200];
  const limits = {
    innerLower: [0, 0.5, 0.55, 0.6],
    innerUpper: [1, 0.8, 0.75, 0.7],
    outerLower: [0, 0.42, 0.5, 0.56],
    outerUpper: [1, 0.88, 0.8, 0.74],
  };
  const points = [
    { id: 1, label: 'P1 Alder', n: 120, events: 60, rate: 0.5, flag: lowOutlier },
    { id: 2, label: 'P2 Birch', n: 80, events: 52, rate: 0.65, flag: within },
    { id: 3, label: 'P3 Cedar', n: 0, events: 0, rate: null, flag: within },
  ];

  it('draws one focusable point per practice with a rate, shaped by its flag', () => {
    const { container } = render(
      <FunnelPlot title="HbA1c" points={points} curveN={curveN} limits={limits} target={0.65} />,
    );
    const buttons = screen.getAllByRole('button');
    expect(buttons).toHaveLength(2);
    expect(buttons[0]!.getAttribute('aria-label')).toBe(
      'P1 Alder: 50.0 %, 60 of 120; Outlier: below the 99.8 % limit (worse than the region)',
    );
    expect(container.querySelectorAll('path.cairn-limit-outer')).toHaveLength(2);
    expect(container.querySelectorAll('path.cairn-limit-inner')).toHaveLength(2);
    expect(screen.getByText(/Region rate 65.0 %/)).toBeTruthy();
  });

  it('shows the card on focus and opens the practice on Enter and on click', () => {
    const onSelect = vi.fn();
    render(
      <FunnelPlot
        title="HbA1c"
        points={points}
        curveN={curveN}
        limits={limits}
        target={0.65}
        onSelect={onSelect}
      />,
    );
    const point = screen.getAllByRole('button')[1]!;
    fireEvent.focus(point);
    expect(screen.getByRole('status').textContent).toContain('P2 Birch');
    fireEvent.keyDown(point, { key: 'Enter' });
    fireEvent.click(screen.getAllByRole('button')[0]!);
    expect(onSelect.mock.calls).toEqual([[2], [1]]);
  });
});

describe('SurvivalChart', () => {
  it('labels the rule of thumb and both medians', () => {
    render(
      <SurvivalChart
        practice={{ label: 'Practice', steps: [{ time: 5, survival: 0.6 }], median: 8 }}
        region={{ label: 'Region', steps: [{ time: 6, survival: 0.5 }], median: 7 }}
        ruleOfThumbYears={7}
      />,
    );
    expect(screen.getByText('Rule of thumb: about 7 years')).toBeTruthy();
    expect(screen.getByText('Region median 7 y')).toBeTruthy();
    expect(screen.getByText('Practice median 8 y')).toBeTruthy();
    expect(screen.getByRole('img').getAttribute('aria-label')).toContain(
      'Practice median 8 years; Region median 7 years; rule of thumb about 7 years',
    );
  });
});

describe('ChartOrTable', () => {
  it('switches the drawing for its table', () => {
    render(<ChartOrTable label="Funnel plot" chart={<p>drawing</p>} table={<p>figures</p>} />);
    expect(screen.getByText('drawing')).toBeTruthy();
    fireEvent.click(screen.getByLabelText('Show funnel plot as a table'));
    expect(screen.getByText('figures')).toBeTruthy();
    expect(screen.queryByText('drawing')).toBeNull();
  });
});
