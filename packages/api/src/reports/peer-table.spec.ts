/**
 * The peer tables of a report (peer-table.ts, docs/methods.md §9), as a
 * practice's readers get them: their own row in full, and nothing of the
 * other practices that they could work out — checked for random tables with
 * the independent audit of @cairn/metrics (`revealedCounts`), which reads only
 * the counts and what the table shows, taking the reader's own row as known
 * (subtracted from the region totals).
 */
import fc from 'fast-check';
import { revealedCounts } from '@cairn/metrics';
import type { PracticeDto } from '../organisations/dto/practice.dto.js';
import type { DisclosedCellDto } from './dto/report.dto.js';
import { type PeerCounts, practicePeerTable, protectedPeerTable } from './peer-table.js';

const practice = (i: number): PracticeDto => ({
  id: i + 1,
  code: `P${String(i + 1).padStart(3, '0')}`,
  name: `Practice ${i + 1}`,
  localityName: null,
});

const minus = (cell: DisclosedCellDto, own: number): DisclosedCellDto =>
  cell.value === null
    ? cell
    : { ...cell, value: cell.value - own, display: String(cell.value - own) };

const counts = fc
  .array(
    fc
      .integer({ min: 0, max: 40 })
      .chain((n) => fc.integer({ min: 0, max: n }).map((events) => ({ n, events }))),
    { minLength: 2, maxLength: 9 },
  )
  .map((rows) => rows.map((r, i): PeerCounts => ({ practice: practice(i), ...r })));

describe('peer tables of a report', () => {
  it('shows a small worked table: "< 5", the cell that protects it, and rates of n ≥ 10 only', () => {
    const rows = [
      { practice: practice(0), events: 3, n: 23 },
      { practice: practice(1), events: 15, n: 45 },
      { practice: practice(2), events: 40, n: 62 },
    ];
    const t = protectedPeerTable('m', 'all', rows);
    expect(t.rows[0]!.met).toEqual({ value: null, display: '< 5', suppression: 'primary' });
    expect(t.rows[0]!.rate).toBeNull();
    expect(
      t.rows.flatMap((r) => [r.met, r.notMet]).filter((c) => c.suppression === 'secondary').length,
    ).toBeGreaterThan(0);
    expect(t.n).toEqual({ value: 130, display: '130', suppression: 'none' });
  });

  it('never lets a practice’s readers work out another practice’s suppressed count', () => {
    fc.assert(
      fc.property(counts, fc.nat(), (rows, pick) => {
        const own = rows[pick % rows.length]!;
        const others = rows.filter((r) => r !== own);
        const t = practicePeerTable('m', 'all', own, others);
        const mine = t.rows.find((r) => r.own)!;
        expect([mine.met.value, mine.notMet.value, mine.n.value]).toEqual([
          own.events,
          own.n - own.events,
          own.n,
        ]);
        const peers = t.rows.filter((r) => !r.own);
        if (t.withheld) return;
        // What the reader knows of the others: their rows, and the region totals less their own.
        const revealed = revealedCounts(
          others.map((r) => [r.events, r.n - r.events]),
          {
            cells: peers.map((r) => [r.met, r.notMet]),
            rowTotals: peers.map((r) => r.n),
            columnTotals: [minus(t.met, own.events), minus(t.notMet, own.n - own.events)],
            grandTotal: minus(t.n, own.n),
            withheld: false,
          },
        );
        expect(revealed).toEqual([]);
        for (const r of peers) {
          if (r.rate !== null) expect(r.n.value! >= 10 && r.met.value !== null).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
  });
});
