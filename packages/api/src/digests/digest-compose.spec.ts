import { barSegments, barText } from '../mail/mail-layout.js';
import {
  changes,
  composeDigest,
  headline,
  improvementSentence,
  priorities,
} from './digest-compose.js';
import type { DigestInput, DigestMeasure } from './digest-input.js';

// Invented figures for an invented practice.
function measure(key: string, over: Partial<DigestMeasure> = {}): DigestMeasure {
  return {
    key,
    label: `${key} recorded`,
    kind: 'care_process',
    direction: 'higher',
    source: `Guideline for ${key}`,
    n: 100,
    events: 80,
    rate: 0.8,
    interval: { lower: 0.71, upper: 0.87 },
    flag: { band: 'within', side: null, assessment: null },
    regionMedian: 0.8,
    improvement: 0,
    previous: { label: '2026 Q2', rate: 0.8 },
    signals: { shift: null, trend: null },
    ...over,
  };
}

const measures: DigestMeasure[] = [
  measure('hba1c', {
    rate: 0.9,
    events: 90,
    flag: { band: 'notable', side: 'above', assessment: 'better' },
    previous: { label: '2026 Q2', rate: 0.82 },
    signals: { shift: null, trend: { direction: 'up', length: 5 } },
  }),
  measure('foot', {
    rate: 0.6,
    events: 60,
    regionMedian: 0.74,
    improvement: 14,
    flag: { band: 'outlier', side: 'below', assessment: 'worse' },
    previous: { label: '2026 Q2', rate: 0.65 },
  }),
  measure('bmi', {
    rate: 0.7,
    events: 70,
    regionMedian: 0.9,
    improvement: 20,
    previous: { label: '2026 Q2', rate: 0.7 },
  }),
  measure('smoking', {
    rate: 0.78,
    events: 78,
    regionMedian: 0.8,
    improvement: 2,
    previous: { label: '2026 Q2', rate: 0.7 },
  }),
  measure('bp_high', {
    label: 'Blood pressure above 150/90',
    kind: 'treatment_target',
    direction: 'lower',
    rate: 0.3,
    events: 30,
    regionMedian: 0.2,
    improvement: 10,
    flag: { band: 'notable', side: 'above', assessment: 'worse' },
    previous: { label: '2026 Q2', rate: 0.24 },
  }),
  measure('retinal', {
    n: 0,
    events: 0,
    rate: null,
    flag: { band: null, side: null, assessment: null },
    improvement: null,
    previous: null,
  }),
];

const input: DigestInput = {
  region: { name: 'Ostrevale' },
  practice: { id: 12, code: 'OV102', name: 'Quarrybank <Surgery>' },
  quarter: { id: 8, label: '2026 Q3' },
  report: { id: 5, label: '2026 Q3 report', publishedAt: '2026-10-20T09:00:00.000Z' },
  state: 'results',
  measures,
  openReviewCases: 2,
  dataQualityFlags: 3,
  caution: 'Not clinical advice: follow local guidelines and use clinical judgement.',
  links: {
    report: 'https://cairn.example.org/reports/5/practices/12',
    recallLists: 'https://cairn.example.org/practices/12/quarters/8/recall',
    reviewCases: 'https://cairn.example.org/review-cases?practice=12',
    profile: 'https://cairn.example.org/profile',
  },
};

describe('digest content', () => {
  it('counts measures above, within and below the limits; measures without a rate apart', () => {
    const h = headline(measures);
    expect(h.above.map((m) => m.key)).toEqual(['hba1c', 'bp_high']);
    expect(h.below.map((m) => m.key)).toEqual(['foot']);
    expect(h.within.map((m) => m.key)).toEqual(['bmi', 'smoking']);
    expect(h.none.map((m) => m.key)).toEqual(['retinal']);
  });

  it('reads change through the direction: a lower-is-better rate going up is a fall', () => {
    const { gains, falls } = changes(measures);
    // hba1c +8 points, smoking +8 points (tie: key order)
    expect(gains.map((m) => m.key)).toEqual(['hba1c', 'smoking']);
    // bp_high +6 points on a lower-is-better measure (a fall of 6), foot −5 points
    expect(falls.map((m) => m.key)).toEqual(['bp_high', 'foot']);
  });

  it('puts measures flagged worse first (outlier before notable), then the most people', () => {
    expect(priorities(measures).map((m) => m.key)).toEqual(['foot', 'bp_high', 'bmi']);
    expect(priorities([measure('a'), measure('b', { improvement: 0 })])).toEqual([]);
  });

  it('says how many people would bring the practice to the region median', () => {
    expect(improvementSentence(measures[1]!, 'Quarrybank')).toBe(
      'foot recorded: 14 more people meeting it would bring Quarrybank to the region median (74%).',
    );
    expect(improvementSentence(measures[4]!, 'Quarrybank')).toBe(
      'Blood pressure above 150/90: 10 fewer people counted in it would bring Quarrybank to the region median (20%).',
    );
    expect(improvementSentence(measure('x', { improvement: 1, regionMedian: 0.5 }), 'Q')).toContain(
      '1 more person',
    );
  });
});

describe('composeDigest', () => {
  const mail = composeDigest(input, { name: 'Priya Calloway', isUser: true });

  it('writes HTML with inline styles only and no image, script or outside fetch', () => {
    expect(mail.html).toMatch(/^<!DOCTYPE html>/);
    expect(mail.html).not.toMatch(/<img\b|<link\b|<script\b|<style\b|url\(|@import|src=/i);
    expect(mail.html).toContain('Quarrybank &lt;Surgery&gt;');
    expect(mail.html).not.toContain('<Surgery>');
  });

  it('gives the headline, the changes, the priorities, review cases and links in both parts', () => {
    for (const part of [mail.html, mail.text.replace(/\s+/g, ' ')]) {
      expect(part).toContain('2 lie above the region');
      expect(part).toContain('2 within them and 1 below');
      expect(part).toContain(
        'hba1c recorded: a run-chart trend, 5 quarters in a row going up (improving)',
      );
      expect(part).toContain('foot recorded: down 5 percentage points to 60% (2026 Q2 65%), worse');
      expect(part).toContain('14 more people meeting it');
      expect(part).toContain('2 review cases are waiting');
      expect(part).toContain('3 data-quality flags');
      expect(part).toContain('https://cairn.example.org/reports/5/practices/12');
      expect(part).toContain('https://cairn.example.org/practices/12/quarters/8/recall');
      expect(part).toContain('https://cairn.example.org/profile');
    }
    expect(mail.subject).toBe('Quarrybank <Surgery>: your 2026 Q3 digest');
  });

  it('carries the caution and the guideline source of every measure it names, and only those', () => {
    const text = mail.text.replace(/\s+/g, ' ');
    expect(text).toContain('not clinical advice');
    expect(text).toContain('Not clinical advice: follow local guidelines');
    expect(mail.html).toContain('Not clinical advice: follow local guidelines');
    for (const key of ['hba1c', 'foot', 'bmi', 'smoking', 'bp_high'])
      expect(text).toContain(`Guideline for ${key}`);
    expect(text).not.toContain('Guideline for retinal');
  });

  it('draws the priorities as bars of table cells, each 100 % wide, and as text bars', () => {
    const bars = [...mail.html.matchAll(/<tr>((?:<td width="\d+%"[^>]*>&nbsp;<\/td>)+)<\/tr>/g)];
    expect(bars).toHaveLength(3);
    for (const [, cells] of bars) {
      const widths = [...cells!.matchAll(/width="(\d+)%"/g)].map((w) => Number(w[1]));
      expect(widths.reduce((a, b) => a + b, 0)).toBe(100);
    }
    expect(mail.text).toContain(barText(60, 74));
  });

  it('speaks to an extra address without pointing at a profile it does not have', () => {
    const extra = composeDigest(input, { name: null, isUser: false });
    expect(extra.text).toMatch(/^Hello,/);
    expect(extra.text).toContain('ask the regional lead to remove it');
    expect(extra.text).not.toContain('/profile');
  });

  it('says plainly when the practice has no figures in the report', () => {
    const none = composeDigest(
      { ...input, state: 'no-current-submission', measures: [], openReviewCases: 0 },
      { name: 'Daniel Oyelaran', isUser: true },
    );
    expect(none.text).toContain('has no figures for Quarrybank <Surgery> (OV102)');
    expect(none.text).toContain('No review case is waiting');
    expect(none.text).not.toContain('Where the measures come from');
    expect(none.html).toContain('not clinical advice');
  });

  it('composes the same message every time for the same input', () => {
    expect(composeDigest(input, { name: 'Priya Calloway', isUser: true })).toEqual(mail);
  });
});

describe('bars of table cells', () => {
  it('fills to the rate, marks the median with a 1 % cell, and always spans 100 %', () => {
    expect(barSegments(60, 74).map(([w]) => w)).toEqual([60, 14, 1, 25]);
    expect(barSegments(90, 74).map(([w]) => w)).toEqual([74, 1, 15, 10]);
    expect(barSegments(null, null).map(([w]) => w)).toEqual([100]);
    expect(barSegments(100, 100).map(([w]) => w)).toEqual([99, 1]);
    for (const [v, m] of [
      [0, 0],
      [33.4, 66.6],
      [50, 50],
      [120, -5],
    ] as const)
      expect(barSegments(v, m).reduce((a, [w]) => a + w, 0)).toBe(100);
  });

  it('writes the same bar in text', () => {
    expect(barText(50, 75, 8)).toBe('[####..|.]');
    expect(barText(null, null, 4)).toBe('[....]');
  });
});
