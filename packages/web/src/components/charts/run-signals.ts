/** Run-chart signals (shift, trend, runs) in words, for charts and their tables. */

export interface SignalsLike {
  median: number | null;
  tooFewRuns: boolean;
  tooManyRuns: boolean;
  shifts: { start: number; end: number; length: number; side: 'above' | 'below' }[];
  trends: { start: number; end: number; length: number; direction: 'up' | 'down' }[];
}

/** One sentence per signal, naming the quarters it spans. */
export function signalSentences(signals: SignalsLike, quarterLabels: readonly string[]): string[] {
  const at = (i: number) => quarterLabels[i] ?? `point ${i + 1}`;
  const out: string[] = [];
  for (const t of signals.trends) {
    out.push(
      `Trend ${t.direction === 'up' ? 'upward' : 'downward'}: ${t.length} points in a row ${t.direction === 'up' ? 'rising' : 'falling'}, ${at(t.start)} to ${at(t.end)}`,
    );
  }
  for (const s of signals.shifts) {
    out.push(
      `Shift ${s.side} the median: ${s.length} points in a row, ${at(s.start)} to ${at(s.end)}`,
    );
  }
  if (signals.tooFewRuns) out.push('Too few runs: the rate has moved away from its median');
  if (signals.tooManyRuns) out.push('Too many runs: the rate alternates more than chance would');
  return out;
}

/** Indices of points that belong to a shift or a trend. */
export function signalledPoints(signals: SignalsLike): Set<number> {
  const marked = new Set<number>();
  for (const s of [...signals.shifts, ...signals.trends]) {
    for (let i = s.start; i <= s.end; i++) marked.add(i);
  }
  return marked;
}
