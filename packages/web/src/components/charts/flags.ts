/**
 * How Cairn shows a funnel flag: a shape and words, never colour alone.
 * Direction of the triangle = better (points up) or worse (points down) than
 * the region; an outline = beyond the 95 % limits ("notable"); filled =
 * beyond the 99.8 % limits ("outlier"); a circle = within the limits.
 */

/** The flag as the API sends it (FlagDto and FlagWithLimitsDto share these fields). */
export interface FlagLike {
  band: 'within' | 'notable' | 'outlier' | null;
  side: 'above' | 'below' | null;
  assessment: 'better' | 'worse' | null;
}

export type FlagKind =
  'none' | 'within' | 'notable-better' | 'notable-worse' | 'outlier-better' | 'outlier-worse';

export function flagKind(flag: FlagLike | null | undefined): FlagKind {
  if (!flag || flag.band === null) return 'none';
  if (flag.band === 'within') return 'within';
  const better = flag.assessment === 'better';
  return `${flag.band}-${better ? 'better' : 'worse'}`;
}

const sideWords = { above: 'above', below: 'below' } as const;

/** Short words for a table cell: "Within limits", "Outlier, worse". */
export function flagShortText(flag: FlagLike | null | undefined): string {
  switch (flagKind(flag)) {
    case 'none':
      return 'Not assessed';
    case 'within':
      return 'Within limits';
    case 'notable-better':
      return 'Notable, better';
    case 'notable-worse':
      return 'Notable, worse';
    case 'outlier-better':
      return 'Outlier, better';
    case 'outlier-worse':
      return 'Outlier, worse';
  }
}

/** A sentence: where the rate lies against the limits, and whether that is good news. */
export function flagText(flag: FlagLike | null | undefined): string {
  const kind = flagKind(flag);
  if (kind === 'none') return 'Not assessed (no one in the denominator)';
  if (kind === 'within') return 'Within the 95 % limits: in line with the region';
  const side = flag?.side ? sideWords[flag.side] : 'beyond';
  const better = flag?.assessment === 'better';
  const limit = flag?.band === 'outlier' ? '99.8 %' : '95 %';
  const label = flag?.band === 'outlier' ? 'Outlier' : 'Notable';
  return `${label}: ${side} the ${limit} limit (${better ? 'better' : 'worse'} than the region)`;
}

/** SVG path of the flag's shape, centred on 0,0, fitting a box of `size`. */
export function flagPath(kind: FlagKind, size = 10): string {
  const r = size / 2;
  switch (kind) {
    case 'within': {
      const c = r * 0.8;
      return `M ${-c} 0 A ${c} ${c} 0 1 0 ${c} 0 A ${c} ${c} 0 1 0 ${-c} 0 Z`;
    }
    case 'notable-better':
    case 'outlier-better':
      return `M 0 ${-r} L ${r} ${r * 0.8} L ${-r} ${r * 0.8} Z`;
    case 'notable-worse':
    case 'outlier-worse':
      return `M 0 ${r} L ${r} ${-r * 0.8} L ${-r} ${-r * 0.8} Z`;
    case 'none':
      return `M ${-r * 0.7} 0 L ${r * 0.7} 0`;
  }
}

/** Fill and stroke by kind: CSS variables of Cairn's palette (tokens.css). */
export function flagPaint(kind: FlagKind): { fill: string; stroke: string } {
  switch (kind) {
    case 'within':
      return { fill: 'var(--cairn-surface-raised)', stroke: 'var(--cairn-within)' };
    case 'notable-better':
      return { fill: 'var(--cairn-surface-raised)', stroke: 'var(--cairn-better)' };
    case 'outlier-better':
      return { fill: 'var(--cairn-better)', stroke: 'var(--cairn-better)' };
    case 'notable-worse':
      return { fill: 'var(--cairn-surface-raised)', stroke: 'var(--cairn-worse)' };
    case 'outlier-worse':
      return { fill: 'var(--cairn-worse)', stroke: 'var(--cairn-worse)' };
    case 'none':
      return { fill: 'none', stroke: 'var(--cairn-within)' };
  }
}
