/**
 * A table of counts with its row and column totals seen as a bipartite graph, the view behind
 * two-way secondary suppression (protect-table.ts) and its audit (audit-suppression.ts).
 *
 * Add a row of column totals and a column of row totals, negated, and the grand total: every
 * row and every column of this augmented table sums to zero. Each cell (totals included) is an
 * edge between its row node and its column node. A change to the suppressed cells that keeps
 * every published cell and total is a vector d that is zero on published edges and sums to zero
 * at every node: a circulation. So a suppressed cell can take another value exactly when it lies
 * on a cycle of suppressed edges along which every cell can move the way the cycle moves it
 * (L. H. Cox, Network models for complementary cell suppression, J Am Stat Assoc
 * 1995;90:1453–62, from memory; the same cycle view underlies the linear-programming audit of
 * M. Fischetti & J. J. Salazar-González, Models and algorithms for optimizing cell suppression
 * in tabular data with linear constraints, J Am Stat Assoc 2000;95:916–28, from memory).
 *
 * What a reader knows of each cell fixes which way it may move: a published cell not at all; a
 * cell shown as "< 5" lies in 1 … 4; a withheld cell is not 1 … 4 (it would say "< 5") and Cairn
 * never withholds a 0 to protect another cell, so it is at least 5; a total not published at all
 * is free. An edge gets an arc row → column when its cell may grow by a small step in the
 * direction that d > 0 moves it, and column → row for the other way. A cell is protected when a
 * directed cycle runs through one of its arcs without using its own edge twice. Because the
 * constraint matrix of a two-way table is totally unimodular and every bound is a whole number,
 * a cell that can move at all can move by a whole 1, both in the real and in the whole-number
 * reading.
 */

export type EdgeState = 'published' | 'primary' | 'secondary' | 'free';

/** A cell, a total or the grand total: `row` or `column` is 'total' for a margin. */
export interface TablePosition {
  row: number | 'total';
  column: number | 'total';
}

export interface SuppressionEdge {
  position: TablePosition;
  /** Row node (0 … rows, `rows` being the row of column totals). */
  rowNode: number;
  /** Column node (0 … columns, `columns` being the column of row totals). */
  columnNode: number;
  /** The count (a total is its sum, never negated). */
  value: number;
  /** +1 for cells and the grand total, −1 for row and column totals (negated in the graph). */
  sign: 1 | -1;
  state: EdgeState;
}

export interface SuppressionGraph {
  rows: number;
  columns: number;
  minCount: number;
  edges: SuppressionEdge[];
  /** Edges at each node; nodes 0 … rows are row nodes, then rows + 1 + c the column nodes. */
  incident: number[][];
}

export const columnNodeId = (graph: Pick<SuppressionGraph, 'rows'>, column: number): number =>
  graph.rows + 1 + column;

/** Whether a cell in this state may move by a small step up (+1) or down (−1). */
export function mayMove(state: EdgeState, value: number, minCount: number, up: boolean): boolean {
  switch (state) {
    case 'free':
      return true;
    case 'published':
      return false;
    case 'primary':
      // Shown as "< minCount": 1 … minCount − 1.
      return up ? value < minCount - 1 : value > 1;
    case 'secondary':
      // Withheld: 0 is never withheld to protect another cell, 1 … minCount − 1 would be "< n".
      return up ? true : value > minCount;
  }
}

/** Whether a published cell could be withheld to protect another, and which ways it would move. */
export function candidateMoves(edge: SuppressionEdge, minCount: number): boolean {
  return edge.state === 'published' && edge.value >= minCount;
}

/**
 * Arc from `from` across edge `e` in the graph: the count moves by +sign when it goes row →
 * column (d > 0), by −sign when column → row.
 */
function arcOpen(
  graph: SuppressionGraph,
  edge: SuppressionEdge,
  fromRowSide: boolean,
  asCandidate: boolean,
): boolean {
  const up = fromRowSide ? edge.sign === 1 : edge.sign === -1;
  const state = asCandidate ? 'secondary' : edge.state;
  return mayMove(state, edge.value, graph.minCount, up);
}

export interface PathSearch {
  /** Cost of withholding a published cell to use it; null: never. */
  cost: (edge: SuppressionEdge) => number | null;
}

/**
 * The cheapest directed path from node `from` to node `to` that does not use edge `skip`:
 * suppressed and free edges cost nothing, a published edge costs `search.cost` (when it may be
 * withheld at all). Returns the edges of the path, or null when there is none. Dijkstra's
 * algorithm with a binary heap; ties broken by node number, so the result is deterministic.
 */
export function cheapestPath(
  graph: SuppressionGraph,
  from: number,
  to: number,
  skip: number,
  search: PathSearch | null,
): { cost: number; edges: number[] } | null {
  const nodes = graph.rows + graph.columns + 2;
  const dist = new Float64Array(nodes).fill(Infinity);
  const via = new Int32Array(nodes).fill(-1);
  const done = new Uint8Array(nodes);
  const heap: [number, number][] = [];
  const push = (d: number, node: number) => {
    heap.push([d, node]);
    let i = heap.length - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!less(heap[i]!, heap[parent]!)) break;
      [heap[i], heap[parent]] = [heap[parent]!, heap[i]!];
      i = parent;
    }
  };
  const pop = (): [number, number] => {
    const top = heap[0]!;
    const last = heap.pop()!;
    if (heap.length > 0) {
      heap[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < heap.length && less(heap[l]!, heap[m]!)) m = l;
        if (r < heap.length && less(heap[r]!, heap[m]!)) m = r;
        if (m === i) break;
        [heap[i], heap[m]] = [heap[m]!, heap[i]!];
        i = m;
      }
    }
    return top;
  };
  dist[from] = 0;
  push(0, from);
  while (heap.length > 0) {
    const [d, node] = pop();
    if (done[node]) continue;
    done[node] = 1;
    if (node === to) break;
    const onRowSide = node <= graph.rows;
    for (const e of graph.incident[node]!) {
      if (e === skip) continue;
      const edge = graph.edges[e]!;
      let step: number;
      if (edge.state === 'published') {
        if (!search || !candidateMoves(edge, graph.minCount)) continue;
        if (!arcOpen(graph, edge, onRowSide, true)) continue;
        const c = search.cost(edge);
        if (c === null) continue;
        step = c;
      } else {
        if (!arcOpen(graph, edge, onRowSide, false)) continue;
        step = 0;
      }
      const next = onRowSide ? columnNodeId(graph, edge.columnNode) : edge.rowNode;
      const nd = d + step;
      if (nd < dist[next]! || (nd === dist[next]! && via[next]! > e)) {
        if (done[next]) continue;
        dist[next] = nd;
        via[next] = e;
        push(nd, next);
      }
    }
  }
  if (!done[to]) return null;
  const edges: number[] = [];
  for (let node = to; node !== from;) {
    const e = via[node]!;
    edges.push(e);
    const edge = graph.edges[e]!;
    const columnNode = columnNodeId(graph, edge.columnNode);
    node = node === columnNode ? edge.rowNode : columnNode;
  }
  return { cost: dist[to]!, edges };
}

function less(a: [number, number], b: [number, number]): boolean {
  return a[0] < b[0] || (a[0] === b[0] && a[1] < b[1]);
}

/**
 * Whether a suppressed edge is protected: some directed cycle runs through one of its open arcs
 * without using its own edge again (with `search`, the cheapest such cycle when published cells
 * may be withheld too). Returns the cheapest way found, or null.
 */
export function protectingCycle(
  graph: SuppressionGraph,
  e: number,
  search: PathSearch | null,
): { cost: number; edges: number[] } | null {
  const edge = graph.edges[e]!;
  const rowNode = edge.rowNode;
  const colNode = columnNodeId(graph, edge.columnNode);
  let best: { cost: number; edges: number[] } | null = null;
  // Arc row → column, closed by a path column ⇝ row; then the arc column → row.
  for (const fromRowSide of [true, false]) {
    if (!arcOpen(graph, edge, fromRowSide, false)) continue;
    const path = fromRowSide
      ? cheapestPath(graph, colNode, rowNode, e, search)
      : cheapestPath(graph, rowNode, colNode, e, search);
    if (path && (!best || path.cost < best.cost)) best = path;
  }
  return best;
}

/** The graph of a table of counts and the state of every cell and total. */
export function buildGraph(
  counts: readonly (readonly number[])[],
  minCount: number,
  state: (position: TablePosition, value: number) => EdgeState,
): SuppressionGraph {
  const rows = counts.length;
  const columns = counts[0]?.length ?? 0;
  const rowTotals = counts.map((r) => r.reduce((a, b) => a + b, 0));
  const columnTotals = Array.from({ length: columns }, (_, j) =>
    counts.reduce((a, r) => a + (r[j] as number), 0),
  );
  const grand = rowTotals.reduce((a, b) => a + b, 0);
  const graph: SuppressionGraph = {
    rows,
    columns,
    minCount,
    edges: [],
    incident: Array.from({ length: rows + columns + 2 }, () => []),
  };
  const add = (
    position: TablePosition,
    rowNode: number,
    columnNode: number,
    value: number,
    sign: 1 | -1,
  ) => {
    const index = graph.edges.length;
    graph.edges.push({ position, rowNode, columnNode, value, sign, state: state(position, value) });
    graph.incident[rowNode]!.push(index);
    graph.incident[columnNodeId(graph, columnNode)]!.push(index);
  };
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < columns; j++) add({ row: i, column: j }, i, j, counts[i]![j]!, 1);
  }
  for (let i = 0; i < rows; i++) add({ row: i, column: 'total' }, i, columns, rowTotals[i]!, -1);
  for (let j = 0; j < columns; j++) {
    add({ row: 'total', column: j }, rows, j, columnTotals[j]!, -1);
  }
  add({ row: 'total', column: 'total' }, rows, columns, grand, 1);
  return graph;
}
