/**
 * The audit of a suppressed table (methods §9): which suppressed counts a reader could work out
 * exactly from what is published. A count is revealed when no cycle of suppressed cells and
 * totals, each able to move the way the cycle moves it, runs through it (suppression-graph.ts).
 * Independent of how the suppressions were chosen: it reads only the counts and what the table
 * shows of each.
 */
import type { DisclosedCell } from './disclosure-control.js';
import type { ProtectedTable } from './protect-table.js';
import { assertTable, tableMinCount } from './protect-table.js';
import {
  buildGraph,
  type EdgeState,
  protectingCycle,
  type TablePosition,
} from './suppression-graph.js';

export type { TablePosition } from './suppression-graph.js';

function stateOf(cell: DisclosedCell | null | undefined): EdgeState {
  if (!cell) return 'free';
  return cell.suppression === 'none' ? 'published' : cell.suppression;
}

/** Every suppressed count (cells and totals) that the published cells and totals reveal. */
export function revealedCounts(
  counts: readonly (readonly number[])[],
  table: Pick<ProtectedTable, 'cells' | 'rowTotals' | 'columnTotals' | 'grandTotal' | 'withheld'>,
  o: { minCount?: number } = {},
): TablePosition[] {
  const minCount = tableMinCount(o);
  assertTable(counts);
  if (table.withheld) return [];
  const graph = buildGraph(counts, minCount, ({ row, column }) => {
    if (row === 'total' && column === 'total') return stateOf(table.grandTotal);
    if (row === 'total') return stateOf(table.columnTotals?.[column as number]);
    if (column === 'total') return stateOf(table.rowTotals?.[row]);
    return stateOf(table.cells[row]?.[column]);
  });
  const revealed: TablePosition[] = [];
  graph.edges.forEach((edge, index) => {
    if (edge.state !== 'primary' && edge.state !== 'secondary') return;
    if (!protectingCycle(graph, index, null)) revealed.push(edge.position);
  });
  return revealed;
}
