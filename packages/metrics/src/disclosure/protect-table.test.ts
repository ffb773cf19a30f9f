/**
 * Two-way disclosure control (methods §9). The worked examples are checked by hand; the property
 * tests check every suppressed count of random tables with an independent linear-programming
 * solver (javascript-lp-solver, a general-purpose library from the npm registry, used only here):
 * the smallest and the largest value each suppressed count can take, given every published cell
 * and total, non-negativity, "< 5" meaning 1 … 4 and a withheld cell being at least 5, must be at
 * least 1 apart.
 */
import fc from 'fast-check';
import lpModule from 'javascript-lp-solver';
import { describe, expect, it } from 'vitest';
import type { DisclosedCell } from './disclosure-control.js';
import { revealedCounts } from './audit-suppression.js';
import { type ProtectedTable, type PublishedTotals, protectTable } from './protect-table.js';

type Position = { row: number | 'total'; column: number | 'total' };

interface LpResult {
  feasible: boolean;
  result: number;
  bounded?: boolean;
}
// The package's types describe its CommonJS build, whose default export is the module itself;
// vitest loads its ES module build, whose default export is the solver.
const solver = ((lpModule as unknown as { default?: unknown }).default ?? lpModule) as {
  Solve(model: object): LpResult;
};

/** Every count of the table with its position, what is shown of it, and its value. */
function entries(counts: number[][], t: ProtectedTable) {
  const rows = counts.length;
  const columns = counts[0]!.length;
  const rowTotals = counts.map((r) => r.reduce((a, b) => a + b, 0));
  const columnTotals = Array.from({ length: columns }, (_, j) =>
    counts.reduce((a, r) => a + r[j]!, 0),
  );
  const grand = rowTotals.reduce((a, b) => a + b, 0);
  const out: { position: Position; shown: DisclosedCell | null; value: number }[] = [];
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < columns; j++) {
      out.push({ position: { row: i, column: j }, shown: t.cells[i]![j]!, value: counts[i]![j]! });
    }
  }
  for (let i = 0; i < rows; i++) {
    out.push({
      position: { row: i, column: 'total' },
      shown: t.rowTotals?.[i] ?? null,
      value: rowTotals[i]!,
    });
  }
  for (let j = 0; j < columns; j++) {
    out.push({
      position: { row: 'total', column: j },
      shown: t.columnTotals?.[j] ?? null,
      value: columnTotals[j]!,
    });
  }
  out.push({ position: { row: 'total', column: 'total' }, shown: t.grandTotal, value: grand });
  return out;
}

const nameOf = (p: Position) => `v_${p.row}_${p.column}`;

/**
 * The range [min, max] of each suppressed count given what the table publishes, by linear
 * programming (max is Infinity when unbounded). A reader's knowledge: published values, the sums
 * of every published row, column and grand total, counts ≥ 0, "< m" = 1 … m − 1, withheld ≥ m.
 */
function ranges(counts: number[][], t: ProtectedTable, minCount: number) {
  const all = entries(counts, t);
  const rows = counts.length;
  const columns = counts[0]!.length;
  const byKey = new Map(all.map((e) => [nameOf(e.position), e]));
  const constraints: Record<string, { equal?: number; min?: number; max?: number }> = {};
  const variables: Record<string, Record<string, number>> = {};
  const unknown = all.filter((e) => e.shown && e.shown.suppression !== 'none');
  for (const e of unknown) {
    const name = nameOf(e.position);
    variables[name] = { [`lo_${name}`]: 1, [`hi_${name}`]: 1 };
    if (e.shown!.suppression === 'primary') {
      constraints[`lo_${name}`] = { min: 1 };
      constraints[`hi_${name}`] = { max: minCount - 1 };
    } else {
      constraints[`lo_${name}`] = { min: minCount };
      constraints[`hi_${name}`] = { max: 1e9 };
    }
  }
  /** Adds Σ coefficient × count = 0 over positions: published counts move to the right. */
  const equation = (id: string, terms: [Position, number][]) => {
    let rhs = 0;
    for (const [p, coefficient] of terms) {
      const e = byKey.get(nameOf(p))!;
      if (e.shown && e.shown.suppression !== 'none') {
        variables[nameOf(p)]![id] = coefficient;
      } else {
        rhs -= coefficient * e.value;
      }
    }
    constraints[id] = { equal: rhs };
  };
  const shownAt = (p: Position) => byKey.get(nameOf(p))!.shown !== null;
  for (let i = 0; i < rows; i++) {
    if (!shownAt({ row: i, column: 'total' })) continue;
    equation(`row_${i}`, [
      ...Array.from({ length: columns }, (_, j): [Position, number] => [{ row: i, column: j }, 1]),
      [{ row: i, column: 'total' }, -1],
    ]);
  }
  for (let j = 0; j < columns; j++) {
    if (!shownAt({ row: 'total', column: j })) continue;
    equation(`column_${j}`, [
      ...Array.from({ length: rows }, (_, i): [Position, number] => [{ row: i, column: j }, 1]),
      [{ row: 'total', column: j }, -1],
    ]);
  }
  if (t.grandTotal) {
    const cells: [Position, number][] = [];
    for (let i = 0; i < rows; i++) {
      for (let j = 0; j < columns; j++) cells.push([{ row: i, column: j }, 1]);
    }
    equation('grand', [...cells, [{ row: 'total', column: 'total' }, -1]]);
  }
  return unknown.map((e) => {
    const name = nameOf(e.position);
    const solve = (opType: 'min' | 'max') => {
      const result = solver.Solve({
        optimize: 'objective',
        opType,
        constraints,
        variables: Object.fromEntries(
          Object.entries(variables).map(([v, c]) => [v, v === name ? { ...c, objective: 1 } : c]),
        ),
      });
      expect(result.feasible).toBe(true);
      return result.bounded === false ? (opType === 'max' ? Infinity : -Infinity) : result.result;
    };
    return { position: e.position, value: e.value, min: solve('min'), max: solve('max') };
  });
}

const shownAs = (t: ProtectedTable) => t.cells.map((r) => r.map((c) => c.display));

describe('protectTable: worked examples (methods §9)', () => {
  it('publishes a table without small counts as it is', () => {
    const t = protectTable([
      [10, 20],
      [30, 0],
    ]);
    expect(shownAs(t)).toEqual([
      ['10', '20'],
      ['30', '0'],
    ]);
    expect(t.rowTotals!.map((c) => c.display)).toEqual(['30', '30']);
    expect(t.columnTotals!.map((c) => c.display)).toEqual(['40', '20']);
    expect(t.grandTotal!.display).toBe('60');
    expect(t.withheld).toBe(false);
  });

  it('protects one small count with a rectangle of three more cells, smallest first', () => {
    const counts = [
      [3, 20, 12],
      [15, 30, 25],
      [40, 8, 22],
    ];
    const t = protectTable(counts);
    // The 3 needs a partner in its row, one in its column, and the cell closing the rectangle:
    // the cheapest (fewest, then smallest) is 12, 15 and 25.
    expect(shownAs(t)).toEqual([
      ['< 5', '20', 'withheld'],
      ['withheld', '30', 'withheld'],
      ['40', '8', '22'],
    ]);
    expect(t.rowTotals!.every((c) => c.suppression === 'none')).toBe(true);
    expect(revealedCounts(counts, t)).toEqual([]);
    const r = ranges(counts, t, 5);
    // 3 + 12 = 15 in row 0 with the 3 in 1 … 4 and the 12 at least 5: the 3 can be 1 … 4.
    expect(r.find((x) => x.position.row === 0 && x.position.column === 0)).toMatchObject({
      min: 1,
      max: 4,
    });
  });

  it('protects small counts that only a combination of rows and columns would give away', () => {
    // Each row and column with a small count has two of them, so no row or column has exactly one
    // suppressed cell; yet row 0 gives 1 + 1 = 2 and both are at least 1: each must be 1.
    const counts = [
      [1, 1, 10],
      [1, 1, 10],
      [10, 10, 10],
    ];
    const t = protectTable(counts);
    expect(revealedCounts(counts, t)).toEqual([]);
    for (const r of ranges(counts, t, 5)) expect(r.max - r.min).toBeGreaterThanOrEqual(1 - 1e-9);
    const withheld = t.cells.flat().filter((c) => c.suppression === 'secondary').length;
    expect(withheld).toBeGreaterThan(0);
  });

  it('finds a count revealed by a linear combination in a pattern that passes the row and column rule', () => {
    // Two rectangles of withheld cells joined by one more, (1, 2): every row and every column
    // holds two or more withheld cells, but rows 0 + 1 minus columns 0 + 1 leave (1, 2) alone.
    const counts = [
      [10, 11, 12, 13],
      [14, 15, 16, 17],
      [18, 19, 20, 21],
      [22, 23, 24, 25],
    ];
    const withheldAt = new Set(['0,0', '0,1', '1,0', '1,1', '2,2', '2,3', '3,2', '3,3', '1,2']);
    const cell = (v: number, i: number, j: number): DisclosedCell =>
      withheldAt.has(`${i},${j}`)
        ? { value: null, display: 'withheld', suppression: 'secondary' }
        : { value: v, display: String(v), suppression: 'none' };
    const plain = (v: number): DisclosedCell => ({
      value: v,
      display: String(v),
      suppression: 'none',
    });
    const table: ProtectedTable = {
      cells: counts.map((r, i) => r.map((v, j) => cell(v, i, j))),
      rowTotals: counts.map((r) => plain(r.reduce((a, b) => a + b, 0))),
      columnTotals: [0, 1, 2, 3].map((j) => plain(counts.reduce((a, r) => a + r[j]!, 0))),
      grandTotal: plain(counts.flat().reduce((a, b) => a + b, 0)),
      withheld: false,
    };
    expect(revealedCounts(counts, table)).toEqual([{ row: 1, column: 2 }]);
    const lp = ranges(counts, table, 5).find(
      (x) => x.position.row === 1 && x.position.column === 2,
    );
    expect(lp).toMatchObject({ min: 16, max: 16 });
  });

  it('withholds a total when the cells alone cannot protect a count', () => {
    // The 2 has only a 0 below it, so its column total is 2 as well ("< 5"); the cheapest cycle
    // through it runs through the 30 and the second column's total, which is withheld.
    const counts = [
      [2, 30],
      [0, 40],
    ];
    const t = protectTable(counts);
    expect(revealedCounts(counts, t)).toEqual([]);
    expect(t.cells[0]![0]!.display).toBe('< 5');
    expect(t.columnTotals![0]!.suppression).not.toBe('none');
    for (const r of ranges(counts, t, 5)) expect(r.max - r.min).toBeGreaterThanOrEqual(1 - 1e-9);
  });

  it('treats small totals as counts and leaves unpublished totals out', () => {
    const t = protectTable(
      [
        [1, 0],
        [0, 2],
      ],
      { totals: 'rows' },
    );
    expect(t.columnTotals).toBeNull();
    expect(t.rowTotals!.map((c) => c.display)).toEqual(['< 5', '< 5']);
    expect(t.grandTotal!.display).toBe('< 5');
    const none = protectTable([[3, 40]], { totals: 'none' });
    expect(none.rowTotals).toBeNull();
    expect(none.grandTotal).toBeNull();
    // Nothing adds up to anything published: the 3 needs no partner.
    expect(none.cells[0]!.map((c) => c.display)).toEqual(['< 5', '40']);
  });

  it('checks its input and options', () => {
    expect(() => protectTable([[1, 2], [3]])).toThrow(/row 1 has 1 cells/);
    expect(() => protectTable([[1.5]])).toThrow(/counts\[0\]\[0\] must be a non-negative integer/);
    expect(() => protectTable([[1]], { minCount: 2 })).toThrow(/minCount/);
    expect(protectTable([[1, 2]], { minCount: 1 }).cells[0]!.map((c) => c.display)).toEqual([
      '1',
      '2',
    ]);
    expect(protectTable([]).cells).toEqual([]);
  });
});

const tables = fc
  .record({
    rows: fc.integer({ min: 1, max: 6 }),
    columns: fc.integer({ min: 1, max: 6 }),
    totals: fc.constantFrom<PublishedTotals>('both', 'both', 'rows', 'columns', 'none'),
    minCount: fc.constantFrom(3, 5, 5, 10),
  })
  .chain(({ rows, columns, totals, minCount }) =>
    fc.record({
      totals: fc.constant(totals),
      minCount: fc.constant(minCount),
      counts: fc.array(
        fc.array(
          fc.oneof(
            { weight: 3, arbitrary: fc.constant(0) },
            { weight: 3, arbitrary: fc.integer({ min: 1, max: minCount - 1 }) },
            { weight: 4, arbitrary: fc.integer({ min: minCount, max: 60 }) },
          ),
          { minLength: columns, maxLength: columns },
        ),
        { minLength: rows, maxLength: rows },
      ),
    }),
  );

describe('protectTable: properties of random tables', () => {
  it('leaves no suppressed count that the published cells and totals pin down (linear programming)', () => {
    let checked = 0;
    let withheldTables = 0;
    fc.assert(
      fc.property(tables, ({ counts, totals, minCount }) => {
        const t = protectTable(counts, { totals, minCount });
        if (t.withheld) {
          withheldTables++;
          return;
        }
        for (const r of ranges(counts, t, minCount)) {
          checked++;
          // The true value is consistent, and at least one other whole value is too.
          expect(r.min).toBeLessThanOrEqual(r.value + 1e-9);
          expect(r.max).toBeGreaterThanOrEqual(r.value - 1e-9);
          expect(r.max - r.min).toBeGreaterThanOrEqual(1 - 1e-9);
        }
        expect(revealedCounts(counts, t, { minCount })).toEqual([]);
      }),
      { numRuns: 400, seed: 20261204 },
    );
    expect(checked).toBeGreaterThan(1000);
    // A table no pattern can protect is rare: a handful in 400 at most.
    expect(withheldTables).toBeLessThanOrEqual(8);
  });

  it('suppresses exactly the small counts first, never a zero, and shows every other value', () => {
    fc.assert(
      fc.property(tables, ({ counts, totals, minCount }) => {
        const t = protectTable(counts, { totals, minCount });
        if (t.withheld) return;
        for (const e of entries(counts, t)) {
          if (!e.shown) continue;
          const small = e.value > 0 && e.value < minCount;
          expect(e.shown.suppression === 'primary').toBe(small);
          if (e.shown.suppression === 'primary') expect(e.shown.display).toBe(`< ${minCount}`);
          if (e.shown.suppression === 'secondary') expect(e.value).toBeGreaterThanOrEqual(minCount);
          if (e.shown.suppression === 'none') {
            expect(e.shown.value).toBe(e.value);
            expect(e.shown.display).toBe(String(e.value));
          }
        }
      }),
      { numRuns: 300, seed: 7 },
    );
  });

  it('is deterministic', () => {
    fc.assert(
      fc.property(tables, ({ counts, totals, minCount }) => {
        expect(protectTable(counts, { totals, minCount })).toEqual(
          protectTable(counts, { totals, minCount }),
        );
      }),
      { numRuns: 50 },
    );
  });

  it('protects a region-sized table (500 practices × 6 categories) quickly', () => {
    let seed = 42;
    const next = () => {
      seed = (seed * 1103515245 + 12345) % 2 ** 31;
      return seed / 2 ** 31;
    };
    const counts = Array.from({ length: 500 }, () =>
      Array.from({ length: 6 }, () =>
        next() < 0.25 ? Math.floor(next() * 5) : 5 + Math.floor(next() * 80),
      ),
    );
    const started = performance.now();
    const t = protectTable(counts);
    const ms = performance.now() - started;
    expect(t.withheld).toBe(false);
    expect(revealedCounts(counts, t)).toEqual([]);
    expect(ms).toBeLessThan(3000);
  });
});
