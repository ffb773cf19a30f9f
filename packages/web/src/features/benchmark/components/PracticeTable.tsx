import { Menu, MenuItem } from '@blueprintjs/core';
import { useEffect, useRef } from 'react';
import { Cell, Column, ColumnHeaderCell, Table2 } from '@blueprintjs/table';
import { FlagShape } from '../../../components/charts/FlagMark';
import { flagShortText, flagText } from '../../../components/charts/flags';
import type { RegionBenchmark } from '../../../lib/api/types';
import { formatCount, formatPercent } from '../../../lib/format';
import type { SortKey, TableRow } from './table-rows';

const ROW_HEIGHT = 44;
/** The header row: a measure's name over up to three lines (RegionBenchmark.css). */
const HEADER_HEIGHT = 62;

/**
 * Practices × measures (Blueprint Table2): the practice column frozen, arrow
 * keys move the focused cell, each column sorts from its header menu. A cell
 * shows the rate, and the flag as a shape and in words. Headers wrap: every measure's name is
 * read whole (and is its column's tooltip).
 */
export function PracticeTable({
  benchmark,
  rows,
  sort,
  descending,
  onSort,
  onOpen,
}: {
  benchmark: RegionBenchmark;
  rows: TableRow[];
  sort: SortKey;
  descending: boolean;
  onSort: (key: SortKey, descending: boolean) => void;
  onOpen: (practiceId: number) => void;
}) {
  const header = (name: string, key: SortKey) => () => (
    <ColumnHeaderCell
      name={`${name}${sort === key ? (descending ? ' ↓' : ' ↑') : ''}`}
      // The whole name, wrapped over up to three lines (the header row is tall enough), never cut.
      nameRenderer={(shown) => <div className="cairn-bench-header-name">{shown}</div>}
      menuRenderer={() => (
        <Menu>
          <MenuItem icon="sort-asc" text="Sort ascending" onClick={() => onSort(key, false)} />
          <MenuItem icon="sort-desc" text="Sort descending" onClick={() => onSort(key, true)} />
        </Menu>
      )}
    />
  );
  // Table2's scrolling quadrants can be scrolled from the keyboard once they take focus.
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    box.current
      ?.querySelectorAll<HTMLElement>('.bp6-table-quadrant-scroll-container')
      .forEach((el) => {
        if (el.tabIndex !== 0) el.tabIndex = 0;
        if (!el.hasAttribute('role')) el.setAttribute('role', 'group');
        if (!el.hasAttribute('aria-label'))
          el.setAttribute('aria-label', 'Practices by measure, scrollable');
      });
  });
  const widths = [230, 140, ...benchmark.measures.map(() => 168)];
  const height = Math.min(rows.length, 14) * ROW_HEIGHT + HEADER_HEIGHT + 4;
  return (
    <div
      ref={box}
      className="cairn-bench-table"
      style={{ height }}
      // Its section is the landmark ("Practices by measure"); the table itself is a group in it.
      role="group"
      aria-label="Practices by measure: table"
    >
      <Table2
        numRows={rows.length}
        numFrozenColumns={1}
        enableFocusedCell
        enableRowHeader={false}
        enableRowResizing={false}
        defaultRowHeight={ROW_HEIGHT}
        columnWidths={widths}
        cellRendererDependencies={[rows, sort, descending]}
        getCellClipboardData={(row, col) => {
          const r = rows[row];
          if (!r) return '';
          if (col === 0) return `${r.practice.code} ${r.practice.name}`;
          if (col === 1) return r.dataQuality == null ? '' : String(r.dataQuality);
          const cell = r.cells[col - 2];
          return cell ? `${formatPercent(cell.rate)} ${flagShortText(cell.exact)}` : '';
        }}
      >
        {[
          <Column
            key="practice"
            name="Practice"
            columnHeaderCellRenderer={header('Practice', 'practice')}
            cellRenderer={(row) => {
              const r = rows[row];
              return (
                <Cell>
                  {r ? (
                    <a
                      href={`/practices/${r.practice.id}/results?quarter=${benchmark.quarter.id}`}
                      onClick={(e) => {
                        e.preventDefault();
                        onOpen(r.practice.id);
                      }}
                      className="cairn-bench-practice"
                    >
                      <strong>{r.practice.code}</strong> {r.practice.name}
                    </a>
                  ) : null}
                  {r?.practice.localityName ? (
                    <div className="cairn-muted cairn-small">{r.practice.localityName}</div>
                  ) : null}
                </Cell>
              );
            }}
          />,
          <Column
            key="quality"
            name="Data quality"
            columnHeaderCellRenderer={header('Data-quality flags', 'quality')}
            cellRenderer={(row) => {
              const r = rows[row];
              return (
                <Cell>
                  {r?.dataQuality == null ? (
                    <span className="cairn-muted">—</span>
                  ) : r.dataQuality > 0 ? (
                    <strong>{formatCount(r.dataQuality)} flagged</strong>
                  ) : (
                    'none'
                  )}
                </Cell>
              );
            }}
          />,
          ...benchmark.measures.map((m, i) => (
            <Column
              key={m.key}
              name={m.label}
              columnHeaderCellRenderer={header(m.label, `measure:${m.key}`)}
              cellRenderer={(row) => {
                const r = rows[row];
                const cell = r?.cells[i];
                if (!r) return <Cell />;
                if (!cell) {
                  return (
                    <Cell className="cairn-bench-missing">
                      <span>No current submission</span>
                    </Cell>
                  );
                }
                return (
                  <Cell
                    tooltip={`${formatCount(cell.events)} of ${formatCount(cell.n)}; ${flagText(cell.exact)}`}
                  >
                    <span className="cairn-bench-cell">
                      <strong>{formatPercent(cell.rate)}</strong>
                      <FlagShape flag={cell.exact} size={10} />
                    </span>
                    <div className="cairn-small">{flagShortText(cell.exact)}</div>
                  </Cell>
                );
              }}
            />
          )),
        ]}
      </Table2>
    </div>
  );
}
