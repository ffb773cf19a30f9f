/**
 * A practice's digest, composed from its part of a report: a pure function
 * of DigestInput and the recipient, giving the subject, an HTML part (Cairn's
 * mail layout: table layout, inline CSS, bars made of table cells, no image)
 * and a plain-text part. What it says (docs/methods.md §11):
 *
 *  - where the practice stands: how many measures lie above, within and below
 *    the region's limits at its n, each read through the measure's direction;
 *  - what changed: run-chart signals that end at this quarter, and the largest
 *    gains and falls since the previous quarter;
 *  - where improvement matters most: up to three measures with improvement
 *    potential, those flagged worse first, then by the people it would take;
 *  - the review cases waiting for the practice, the clinical caution, and the
 *    guideline source of every measure the digest names;
 *  - links to the report, the recall lists and the review cases (sign-in
 *    needed; no data in a link).
 */
import { type MailBlock, type RenderedMail, renderMail } from '../mail/mail-layout.js';
import type { DigestInput, DigestMeasure, DigestRecipient } from './digest-input.js';

/** Measures the "where improvement matters most" part names, at most */
export const PRIORITY_COUNT = 3;
/** Gains and falls named, at most, each */
export const CHANGE_COUNT = 2;

const pct = (rate: number) => `${Math.round(rate * 100)}%`;
const pp = (difference: number) => {
  const points = Math.round(Math.abs(difference) * 100);
  return `${points} percentage point${points === 1 ? '' : 's'}`;
};
const people = (k: number) => (k === 1 ? 'person' : 'people');

export type Position = 'above' | 'within' | 'below';

/** Where a measure's rate lies against the limits (notable or outlier counts as beyond). */
export function positionOf(measure: DigestMeasure): Position | null {
  if (measure.rate === null || measure.flag.band === null) return null;
  if (measure.flag.band === 'within' || measure.flag.side === null) return 'within';
  return measure.flag.side;
}

export interface Headline {
  above: DigestMeasure[];
  within: DigestMeasure[];
  below: DigestMeasure[];
  /** Measures without a rate or a flag (no one counted) */
  none: DigestMeasure[];
}

export function headline(measures: readonly DigestMeasure[]): Headline {
  const result: Headline = { above: [], within: [], below: [], none: [] };
  for (const m of measures) result[positionOf(m) ?? 'none'].push(m);
  return result;
}

/** Change since the previous quarter, read through the direction: > 0 is better. */
export function gainOf(measure: DigestMeasure): number | null {
  if (measure.rate === null || measure.previous === null) return null;
  const difference = measure.rate - measure.previous.rate;
  return measure.direction === 'higher' ? difference : -difference;
}

/** The largest gains and the largest falls (whole percentage points, at least 1). */
export function changes(measures: readonly DigestMeasure[]): {
  gains: DigestMeasure[];
  falls: DigestMeasure[];
} {
  const moved = measures
    .map((m) => ({ m, gain: gainOf(m) }))
    .filter((x): x is { m: DigestMeasure; gain: number } => x.gain !== null)
    .filter((x) => Math.round(Math.abs(x.gain) * 100) >= 1);
  return {
    gains: moved
      .filter((x) => x.gain > 0)
      .sort((a, b) => b.gain - a.gain || a.m.key.localeCompare(b.m.key))
      .slice(0, CHANGE_COUNT)
      .map((x) => x.m),
    falls: moved
      .filter((x) => x.gain < 0)
      .sort((a, b) => a.gain - b.gain || a.m.key.localeCompare(b.m.key))
      .slice(0, CHANGE_COUNT)
      .map((x) => x.m),
  };
}

const severity = (m: DigestMeasure) =>
  m.flag.assessment !== 'worse' ? 0 : m.flag.band === 'outlier' ? 2 : 1;

/**
 * Where improvement matters most: measures with improvement potential (k > 0), those flagged
 * worse first (outliers before notable), then the most people, then the report's order.
 */
export function priorities(measures: readonly DigestMeasure[]): DigestMeasure[] {
  return measures
    .map((m, index) => ({ m, index }))
    .filter(({ m }) => (m.improvement ?? 0) > 0 && m.regionMedian !== null)
    .sort(
      (a, b) =>
        severity(b.m) - severity(a.m) ||
        (b.m.improvement ?? 0) - (a.m.improvement ?? 0) ||
        a.index - b.index,
    )
    .slice(0, PRIORITY_COUNT)
    .map(({ m }) => m);
}

export function positionWords(m: DigestMeasure): string {
  const position = positionOf(m);
  if (position === null) return 'no one counted';
  if (position === 'within') return 'within the limits';
  const beyond = m.flag.band === 'outlier' ? '99.8 %' : '95 %';
  const reading = m.flag.assessment === 'better' ? 'better' : 'worse';
  return `${position} the ${beyond} limit (${reading} than expected)`;
}

export function improvementSentence(m: DigestMeasure, practiceName: string): string {
  const k = m.improvement ?? 0;
  const median = m.regionMedian === null ? '' : ` (${pct(m.regionMedian)})`;
  return m.direction === 'higher'
    ? `${m.label}: ${k} more ${people(k)} meeting it would bring ${practiceName} to the region median${median}.`
    : `${m.label}: ${k} fewer ${people(k)} counted in it would bring ${practiceName} to the region median${median}.`;
}

function signalSentences(measures: readonly DigestMeasure[]): string[] {
  const lines: string[] = [];
  for (const m of measures) {
    const { shift, trend } = m.signals;
    if (trend) {
      const better = (trend.direction === 'up') === (m.direction === 'higher');
      lines.push(
        `${m.label}: a run-chart trend, ${trend.length} quarters in a row going ${trend.direction} (${better ? 'improving' : 'getting worse'}).`,
      );
    }
    if (shift) {
      const better = (shift.side === 'above') === (m.direction === 'higher');
      lines.push(
        `${m.label}: a run-chart shift, ${shift.length} quarters ${shift.side} the practice's median (${better ? 'better' : 'worse'} than usual).`,
      );
    }
  }
  return lines;
}

function changeSentence(m: DigestMeasure): string {
  const gain = gainOf(m) ?? 0;
  const movement = (m.rate ?? 0) >= (m.previous?.rate ?? 0) ? 'up' : 'down';
  return `${m.label}: ${movement} ${pp(gain)} to ${pct(m.rate ?? 0)} (${m.previous?.label} ${pct(m.previous?.rate ?? 0)}), ${gain > 0 ? 'better' : 'worse'}.`;
}

function count(n: number, one: string, many: string) {
  return `${n} ${n === 1 ? one : many}`;
}

export function composeDigest(input: DigestInput, recipient: DigestRecipient): RenderedMail {
  const { practice, quarter } = input;
  const practiceName = `${practice.name} (${practice.code})`;
  const subject = `${practice.name}: your ${quarter.label} digest`;
  const blocks: MailBlock[] = [];
  const named = new Map<string, DigestMeasure>();
  const h = headline(input.measures);

  if (input.state === 'no-current-submission' || input.measures.length === 0) {
    blocks.push({
      type: 'paragraph',
      text: `${input.report.label} has no figures for ${practiceName}: the practice had no confirmed submission for ${quarter.label}. The report still shows the region's results.`,
    });
  } else {
    const rated = input.measures.length - h.none.length;
    blocks.push(
      {
        type: 'paragraph',
        text: `${input.report.label} is published. Of ${count(rated, 'measure', 'measures')} with figures for ${practiceName}, ${h.above.length} ${h.above.length === 1 ? 'lies' : 'lie'} above the region's limits, ${h.within.length} within them and ${h.below.length} below them.`,
      },
      {
        type: 'facts',
        rows: [
          {
            label: 'Above the limits',
            value: describeGroup(h.above, 'none'),
          },
          { label: 'Within the limits', value: `${h.within.length}` },
          { label: 'Below the limits', value: describeGroup(h.below, 'none') },
          ...(h.none.length > 0
            ? [{ label: 'No one counted', value: h.none.map((m) => m.label).join('; ') }]
            : []),
        ],
      },
    );
    for (const m of [...h.above, ...h.below]) named.set(m.key, m);

    // What changed
    const signals = signalSentences(input.measures);
    const { gains, falls } = changes(input.measures);
    blocks.push({ type: 'heading', text: 'What changed since the previous quarter' });
    if (signals.length + gains.length + falls.length === 0) {
      blocks.push({
        type: 'paragraph',
        text: 'No measure moved by a whole percentage point or more, and no run-chart signal ends this quarter.',
      });
    } else {
      blocks.push({
        type: 'list',
        items: [...signals, ...gains.map(changeSentence), ...falls.map(changeSentence)],
      });
    }
    for (const m of input.measures) if (m.signals.shift || m.signals.trend) named.set(m.key, m);
    for (const m of [...gains, ...falls]) named.set(m.key, m);

    // Where improvement matters most
    const top = priorities(input.measures);
    blocks.push({ type: 'heading', text: 'Where improvement would matter most' });
    if (top.length === 0) {
      blocks.push({
        type: 'paragraph',
        text: `${practiceName} is at or beyond the region median on every measure.`,
      });
    } else {
      blocks.push({ type: 'list', items: top.map((m) => improvementSentence(m, practice.name)) });
      blocks.push({
        type: 'bars',
        caption: 'Your rate (filled) against the region median (the mark)',
        legend:
          'Bars run from 0 % to 100 %. The limits are the region’s funnel limits at your practice’s size.',
        rows: top.map((m) => ({
          label: m.label,
          value: m.rate === null ? null : m.rate * 100,
          mark: m.regionMedian === null ? null : m.regionMedian * 100,
          note: `${m.rate === null ? 'no rate' : pct(m.rate)} (${m.events} of ${m.n})${m.regionMedian === null ? '' : ` · region median ${pct(m.regionMedian)}`} · ${positionWords(m)}`,
        })),
      });
      for (const m of top) named.set(m.key, m);
    }
  }

  // Review cases
  blocks.push({ type: 'heading', text: 'Review cases' });
  blocks.push({
    type: 'paragraph',
    text:
      input.openReviewCases === 0
        ? `No review case is waiting for ${practice.name}.`
        : `${count(input.openReviewCases, 'review case is', 'review cases are')} waiting for ${practice.name}'s answer.`,
  });
  if (input.dataQualityFlags > 0)
    blocks.push({
      type: 'paragraph',
      text: `The submission has ${count(input.dataQualityFlags, 'data-quality flag', 'data-quality flags')}; the report lists them.`,
    });

  blocks.push(
    {
      type: 'action',
      label: `Open ${practice.name}'s report`,
      url: input.links.report,
      note: 'Cairn asks you to sign in first. The links in this message carry no data.',
    },
    { type: 'action', label: 'Recall lists', url: input.links.recallLists },
  );
  if (input.openReviewCases > 0)
    blocks.push({ type: 'action', label: 'Review cases', url: input.links.reviewCases });

  blocks.push({
    type: 'caution',
    title: 'Audit and improvement support, not clinical advice',
    text: input.caution,
  });
  if (named.size > 0) {
    blocks.push({ type: 'heading', text: 'Where the measures come from' });
    blocks.push({
      type: 'list',
      items: input.measures.filter((m) => named.has(m.key)).map((m) => `${m.label}: ${m.source}`),
    });
  }

  const footer = recipient.isUser
    ? [
        `You receive this as a practice lead of ${practice.name}.`,
        `To stop digests, change your mail preferences on your Cairn profile: ${input.links.profile}`,
      ]
    : [
        `You receive this because the regional lead added your address to the mail recipients of ${practice.name}.`,
        'To stop these messages, ask the regional lead to remove it.',
      ];
  footer.push(
    input.state === 'results' && input.measures.length > 0
      ? `Made from ${input.report.label}. The attached data pack (XLSX) holds ${practice.name}'s figures, as on the report's page; this message holds no patient data.`
      : `Made from ${input.report.label}. This message holds no patient data.`,
  );

  return renderMail({
    subject,
    preheader:
      input.state === 'results' && input.measures.length > 0
        ? `${h.above.length} above, ${h.within.length} within, ${h.below.length} below the region's limits.`
        : `${quarter.label}: no figures for ${practice.name}.`,
    regionName: input.region.name,
    greeting: recipient.name ? `Dear ${recipient.name},` : 'Hello,',
    blocks,
    footer,
  });
}

function describeGroup(measures: readonly DigestMeasure[], empty: string): string {
  if (measures.length === 0) return empty;
  return `${measures.length}: ${measures
    .map((m) => `${m.label} (${m.flag.assessment === 'better' ? 'better' : 'worse'})`)
    .join('; ')}`;
}
