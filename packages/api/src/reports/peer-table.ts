/**
 * The tables of a report that name other practices (docs/methods.md §9): per
 * measure, practices × (met, not met) with row totals (each practice's n),
 * column totals and the grand total (the region's), under two-way disclosure
 * control (`protectTable` of @cairn/metrics: counts of 1–4 shown as "< 5",
 * further cells withheld until no suppressed count can be worked out from the
 * rows, the columns and the totals). A rate is shown only when its met and n
 * are shown and n is at least 10 (`discloseRate`).
 *
 * For a practice's readers, their own row is their own data and is shown in
 * full; the table of the other practices is protected on its own (its totals
 * are the region's less the practice's), and a region total is shown only
 * when the other practices' total behind it is, since the reader could
 * subtract their own row from it.
 */
import { discloseRate, protectTable, type DisclosedCell } from '@cairn/metrics';
import type { PracticeDto } from '../organisations/dto/practice.dto.js';
import type { DisclosedCellDto, PeerRowDto, PeerTableDto } from './dto/report.dto.js';

export interface PeerCounts {
  practice: PracticeDto;
  events: number;
  n: number;
}

const full = (value: number): DisclosedCellDto => ({
  value,
  display: String(value),
  suppression: 'none',
});

const cellDto = (c: DisclosedCell): DisclosedCellDto => ({
  value: c.value,
  display: c.display,
  suppression: c.suppression,
});

function rateOf(met: DisclosedCellDto, n: DisclosedCellDto): number | null {
  if (met.value === null || n.value === null) return null;
  return discloseRate(met.value, n.value);
}

/** One measure's table with every practice under disclosure control (none of them the reader's). */
export function protectedPeerTable(
  measure: string,
  split: string,
  rows: readonly PeerCounts[],
): PeerTableDto {
  const counts = rows.map((r) => [r.events, r.n - r.events]);
  const table =
    rows.length > 0
      ? protectTable(counts)
      : { cells: [], rowTotals: [], columnTotals: [full(0), full(0)], grandTotal: full(0) };
  const withheld = 'withheld' in table && table.withheld === true;
  const peerRows: PeerRowDto[] = rows.map((r, i) => {
    const met = cellDto(table.cells[i]![0]!);
    const notMet = cellDto(table.cells[i]![1]!);
    const n = cellDto(table.rowTotals![i]!);
    return { practice: r.practice, own: false, met, notMet, n, rate: rateOf(met, n) };
  });
  const met = cellDto(table.columnTotals![0]!);
  const notMet = cellDto(table.columnTotals![1]!);
  const n = cellDto(table.grandTotal!);
  return { measure, split, rows: peerRows, met, notMet, n, rate: rateOf(met, n), withheld };
}

/** One measure's table for the readers of `own`: their row in full, the others protected. */
export function practicePeerTable(
  measure: string,
  split: string,
  own: PeerCounts,
  others: readonly PeerCounts[],
): PeerTableDto {
  const peers = protectedPeerTable(measure, split, others);
  const plus = (peer: DisclosedCellDto, mine: number): DisclosedCellDto =>
    peer.value === null ? { ...peer } : full(peer.value + mine);
  const met = plus(peers.met, own.events);
  const notMet = plus(peers.notMet, own.n - own.events);
  const n = plus(peers.n, own.n);
  const ownRow: PeerRowDto = {
    practice: own.practice,
    own: true,
    met: full(own.events),
    notMet: full(own.n - own.events),
    n: full(own.n),
    rate: own.n > 0 ? own.events / own.n : null,
  };
  const rows = [...peers.rows, ownRow].sort((a, b) =>
    a.practice.code < b.practice.code ? -1 : a.practice.code > b.practice.code ? 1 : 0,
  );
  return { measure, split, rows, met, notMet, n, rate: rateOf(met, n), withheld: peers.withheld };
}
