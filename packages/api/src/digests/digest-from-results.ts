/**
 * A practice's results (PracticeResultsDto: what a report freezes for each
 * practice, under disclosure control as its leads see it) turned into the
 * measures of its digest. Pure; the "all" split (every person counted) and the
 * over-dispersion-adjusted flag, which equals the exact flag when the region
 * shows no over-dispersion (docs/methods.md §8, Flags; §11).
 */
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';
import type { DigestMeasure } from './digest-input.js';

export function digestMeasures(results: PracticeResultsDto): DigestMeasure[] {
  if (results.state !== 'results') return [];
  const last = results.quarters.length - 1;
  const measures: DigestMeasure[] = [];
  for (const { measure, splits } of results.measures) {
    const all = splits.find((s) => s.split === 'all');
    if (!all) continue;
    const flag = all.own.adjusted;
    // Signals that reach this quarter (the trend's last point is this quarter's).
    const { shifts, trends } = all.trend.signals;
    const shift = shifts.find((s) => s.end === last) ?? null;
    const trend = trends.find((t) => t.end === last) ?? null;
    measures.push({
      key: measure.key,
      label: measure.label,
      kind: measure.kind,
      direction: measure.direction,
      source: measure.source,
      n: all.own.n,
      events: all.own.events,
      rate: all.own.rate,
      interval: { lower: all.own.interval.lower, upper: all.own.interval.upper },
      flag: { band: flag.band, side: flag.side, assessment: flag.assessment },
      regionMedian: all.region.median,
      improvement: all.improvement.records,
      previous: all.change
        ? { label: all.change.previousQuarterLabel, rate: all.change.previousRate }
        : null,
      signals: {
        shift: shift ? { side: shift.side, length: shift.length } : null,
        trend: trend ? { direction: trend.direction, length: trend.length } : null,
      },
    });
  }
  return measures;
}

export const dataQualityFlags = (results: PracticeResultsDto): number =>
  results.dataQuality.reduce((sum, d) => sum + d.count, 0);
