/**
 * Two-way disclosure control of a table of counts with its row and column totals (methods §9).
 *
 * 1. Primary suppression (common practice in official health statistics; threshold
 *    configurable): a count from 1 to minCount − 1 is shown as "< minCount"; 0 is shown. Totals
 *    are counts too.
 * 2. Secondary suppression: further cells are withheld until no suppressed cell can be worked out
 *    from the published cells and totals — by any linear combination of rows and columns, not
 *    only from a row or column with one suppressed cell — taking into account everything a reader
 *    knows: that a count shown as "< 5" lies in 1 … 4, that a withheld cell is at least 5 (Cairn
 *    never withholds a 0 to protect another cell, and 1 … 4 would read "< 5"), and that no count
 *    is negative. The cells are chosen one protecting cycle at a time, by the cheapest path
 *    through the table's graph (suppression-graph.ts; L. H. Cox, Network models for complementary
 *    cell suppression, J Am Stat Assoc 1995;90:1453–62, from memory): cells before totals, few
 *    cells before many, small counts before large ones.
 *
 * The guarantee, checked by property tests against a linear-programming solver: every suppressed
 * cell and total can take at least two whole-number values consistent with what is published, so
 * none is revealed. When no choice of cells can protect a count (a degenerate table), the whole
 * table is withheld and `withheld` says so.
 *
 * A rate whose count is suppressed is withheld with it; a rate whose denominator is under
 * minDenominator is withheld by `discloseRate` (disclosure-control.ts).
 */
import type { DisclosedCell, DisclosureOptions } from './disclosure-control.js';
import {
  buildGraph,
  type EdgeState,
  protectingCycle,
  type SuppressionGraph,
  type TablePosition,
} from './suppression-graph.js';

/** Which totals are published with the table. */
export type PublishedTotals = 'both' | 'rows' | 'columns' | 'none';

export interface TableProtectionOptions extends Pick<DisclosureOptions, 'minCount'> {
  /** Totals published with the table (default both); the grand total goes with any of them. */
  totals?: PublishedTotals;
}

export interface ProtectedTable {
  /** cells[row][column] */
  cells: DisclosedCell[][];
  /** One per row; null when row totals are not published. */
  rowTotals: DisclosedCell[] | null;
  /** One per column; null when column totals are not published. */
  columnTotals: DisclosedCell[] | null;
  grandTotal: DisclosedCell | null;
  /** True when no pattern of suppression could protect every count: everything is withheld. */
  withheld: boolean;
}

const WITHHELD: DisclosedCell = { value: null, display: 'withheld', suppression: 'secondary' };

/** Shape and values of a table of counts, checked. */
export function assertTable(counts: readonly (readonly number[])[]): void {
  const columns = counts[0]?.length ?? 0;
  counts.forEach((row, i) => {
    if (row.length !== columns) {
      throw new RangeError(`row ${i} has ${row.length} cells; row 0 has ${columns}`);
    }
    row.forEach((value, j) => {
      if (!Number.isInteger(value) || value < 0) {
        throw new RangeError(`counts[${i}][${j}] must be a non-negative integer (got ${value})`);
      }
    });
  });
}

export function tableMinCount(o: { minCount?: number }): number {
  const minCount = o.minCount ?? 5;
  if (!Number.isInteger(minCount) || minCount < 1 || minCount === 2) {
    // With 2, a count of 1 would read "< 2": the marker itself would give the value away.
    throw new RangeError(
      `minCount must be 1 (no suppression) or an integer from 3 (got ${minCount})`,
    );
  }
  return minCount;
}

/** The state each count starts in: primary when 1 … minCount − 1, free when not published. */
export function initialState(
  position: TablePosition,
  value: number,
  minCount: number,
  totals: PublishedTotals,
): EdgeState {
  const published =
    position.row !== 'total' && position.column !== 'total'
      ? true
      : position.row === 'total' && position.column === 'total'
        ? totals !== 'none'
        : position.column === 'total'
          ? totals === 'both' || totals === 'rows'
          : totals === 'both' || totals === 'columns';
  if (!published) return 'free';
  return value > 0 && value < minCount ? 'primary' : 'published';
}

function shown(
  graph: SuppressionGraph,
  index: number,
  minCount: number,
  withheld: boolean,
): DisclosedCell {
  const edge = graph.edges[index]!;
  if (withheld) return WITHHELD;
  switch (edge.state) {
    case 'primary':
      return { value: null, display: `< ${minCount}`, suppression: 'primary' };
    case 'secondary':
      return WITHHELD;
    default:
      return { value: edge.value, display: String(edge.value), suppression: 'none' };
  }
}

/** Primary and two-way secondary suppression of a table of counts and its totals. */
export function protectTable(
  counts: readonly (readonly number[])[],
  o: TableProtectionOptions = {},
): ProtectedTable {
  const minCount = tableMinCount(o);
  const totals = o.totals ?? 'both';
  assertTable(counts);
  const graph = buildGraph(counts, minCount, (position, value) =>
    initialState(position, value, minCount, totals),
  );
  const grand = graph.edges[graph.edges.length - 1]!.value;
  // Cells before totals; few cells before many, then small counts before large ones.
  const cost = (edge: { position: TablePosition; value: number }) =>
    (edge.position.row === 'total' || edge.position.column === 'total' ? 1000 : 1) +
    edge.value / (grand + 1);

  let withheld = false;
  const primaries = graph.edges.flatMap((e, i) => (e.state === 'primary' ? [i] : []));
  for (const index of primaries) {
    const cycle = protectingCycle(graph, index, { cost });
    if (!cycle) {
      withheld = true;
      break;
    }
    for (const e of cycle.edges) {
      const edge = graph.edges[e]!;
      if (edge.state === 'published') edge.state = 'secondary';
    }
  }

  const rows = graph.rows;
  const columns = graph.columns;
  const at = (i: number) => shown(graph, i, minCount, withheld);
  const visible = (i: number) => graph.edges[i]!.state !== 'free';
  const rowTotal0 = rows * columns;
  const columnTotal0 = rowTotal0 + rows;
  const grandIndex = columnTotal0 + columns;
  return {
    cells: Array.from({ length: rows }, (_, i) =>
      Array.from({ length: columns }, (_, j) => at(i * columns + j)),
    ),
    rowTotals:
      totals === 'both' || totals === 'rows'
        ? Array.from({ length: rows }, (_, i) => at(rowTotal0 + i))
        : null,
    columnTotals:
      totals === 'both' || totals === 'columns'
        ? Array.from({ length: columns }, (_, j) => at(columnTotal0 + j))
        : null,
    grandTotal: visible(grandIndex) ? at(grandIndex) : null,
    withheld,
  };
}
