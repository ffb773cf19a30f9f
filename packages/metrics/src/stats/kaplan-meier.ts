/**
 * Kaplan–Meier product-limit estimate of survival (E. L. Kaplan & P. Meier, JASA
 * 1958;53:457–81): at each distinct time t with d events among n at risk, S(t) = S(t⁻)·(1 − d/n);
 * those censored at t are counted at risk at t (censoring after events, the usual convention).
 * Greenwood's variance: Var S(t) = S(t)² Σ d/(n(n − d)) (M. Greenwood, 1926). The median is the
 * smallest time with S(t) ≤ ½ (null when survival stays above ½).
 */
export interface SurvivalStep {
  time: number;
  atRisk: number;
  events: number;
  censored: number;
  survival: number;
  /** Greenwood standard error; null once everyone at risk has had the event. */
  standardError: number | null;
}

export interface SurvivalEstimate {
  n: number;
  events: number;
  steps: SurvivalStep[];
  median: number | null;
}

export interface SurvivalCount {
  time: number;
  events: number;
  censored: number;
}

/** Kaplan–Meier from counts of events and censorings per time (any order; times distinct). */
export function kaplanMeierFromCounts(counts: readonly SurvivalCount[]): SurvivalEstimate {
  const sorted = [...counts]
    .filter((c) => c.events > 0 || c.censored > 0)
    .sort((a, b) => a.time - b.time);
  let atRisk = 0;
  let totalEvents = 0;
  for (const c of sorted) {
    atRisk += c.events + c.censored;
    totalEvents += c.events;
  }
  const n = atRisk;
  let survival = 1;
  let greenwood = 0;
  let medianTime: number | null = null;
  const steps: SurvivalStep[] = [];
  for (const c of sorted) {
    if (c.events > 0) {
      survival *= 1 - c.events / atRisk;
      greenwood =
        atRisk > c.events ? greenwood + c.events / (atRisk * (atRisk - c.events)) : Infinity;
    }
    steps.push({
      time: c.time,
      atRisk,
      events: c.events,
      censored: c.censored,
      survival,
      standardError: Number.isFinite(greenwood) ? survival * Math.sqrt(greenwood) : null,
    });
    if (medianTime === null && survival <= 0.5) medianTime = c.time;
    atRisk -= c.events + c.censored;
  }
  return { n, events: totalEvents, steps, median: medianTime };
}

/** Kaplan–Meier from individual times and event indicators (true or 1 = event, else censored). */
export function kaplanMeier(
  times: readonly number[],
  events: readonly (boolean | 0 | 1)[],
): SurvivalEstimate {
  if (times.length !== events.length) {
    throw new RangeError(
      `events must have one entry per time (got ${events.length} for ${times.length} times)`,
    );
  }
  const byTime = new Map<number, SurvivalCount>();
  times.forEach((t, i) => {
    if (typeof t !== 'number' || !Number.isFinite(t) || t < 0) {
      throw new RangeError(`times[${i}] must be a finite number ≥ 0 (got ${String(t)})`);
    }
    const e = events[i];
    if (e !== true && e !== false && e !== 0 && e !== 1) {
      throw new RangeError(`events[${i}] must be true, false, 1 or 0 (got ${String(e)})`);
    }
    const c = byTime.get(t) ?? { time: t, events: 0, censored: 0 };
    if (e === true || e === 1) c.events++;
    else c.censored++;
    byTime.set(t, c);
  });
  return kaplanMeierFromCounts([...byTime.values()]);
}
