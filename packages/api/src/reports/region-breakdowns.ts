/**
 * The region's breakdowns frozen with a report (docs/methods.md §9): for each
 * measure (everyone) and breakdown, its categories × (met, not met) with
 * totals under two-way disclosure control (`protectTable`), read from the
 * region's side of a practice's detail seen without disclosure control.
 */
import { discloseRate, protectTable } from '@cairn/metrics';
import type { PracticeDetailDto } from '../benchmarks/dto/practice-results.dto.js';
import type { RegionBreakdownRow } from './snapshot.js';

export function regionBreakdowns(detail: PracticeDetailDto): RegionBreakdownRow[] {
  const rows: RegionBreakdownRow[] = [];
  for (const m of detail.measures) {
    const everyone = m.splits.find((s) => s.split === 'all');
    if (!everyone) continue;
    for (const b of everyone.breakdowns) {
      if (b.cells.length === 0) continue;
      const counts = b.cells.map((c) => {
        const events = c.region.events.value ?? 0;
        const n = c.region.n.value ?? 0;
        return [events, n - events];
      });
      const t = protectTable(counts);
      b.cells.forEach((c, i) => {
        const met = t.cells[i]![0]!;
        const n = t.rowTotals![i]!;
        rows.push({
          measure: m.measure,
          breakdown: b.breakdown,
          category: c.category,
          met,
          n,
          rate: met.value !== null && n.value !== null ? discloseRate(met.value, n.value) : null,
        });
      });
    }
  }
  return rows;
}
