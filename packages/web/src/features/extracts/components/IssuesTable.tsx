import { Button, ButtonGroup, HTMLSelect, Spinner } from '@blueprintjs/core';
import { Cell, Column, Table2 } from '@blueprintjs/table';
import { useEffect, useMemo, useState } from 'react';
import { EmptyState, Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { Issue, IssueSort, Submission } from '../../../lib/api/types';
import { formatCount } from '../../../lib/format';
import { type IssueFilters, useIssues } from '../api/extracts';
import { SeverityTag, severityLook } from './StatusTag';

export const ISSUE_PAGE = 500;
/** One line of text, or a tag, with the cell's padding */
const ROW_HEIGHT = 28;
/** Column widths at their narrowest; stretched to fill the page's width. */
const BASE_WIDTHS = [56, 140, 140, 120, 160, 255, 255];

/** The base widths scaled to fill `width` (whole pixels, summing to it). */
export function fillWidths(width: number, base: number[] = BASE_WIDTHS): number[] {
  const total = base.reduce((a, b) => a + b, 0);
  if (!(width > total)) return base;
  const scaled = base.map((w) => Math.floor((w * width) / total));
  scaled[scaled.length - 1]! += width - scaled.reduce((a, b) => a + b, 0);
  return scaled;
}

const LINE_HEIGHT = 16;
/** Average width of a character of the table's 12 px Lato text, and a cell's side padding. */
const CHAR_WIDTH = 6.1;
const CELL_PADDING = 20;
/** The cell's padding above and below its lines */
const ROW_PADDING = 10;
const MAX_ROW_HEIGHT = 8 * LINE_HEIGHT + ROW_PADDING;

/** Lines a text takes when wrapped at word boundaries in `perLine` characters. */
export function wrappedLines(text: string, perLine: number): number {
  let lines = 1;
  let used = 0;
  for (const word of text.split(/\s+/).filter(Boolean)) {
    const length = word.length;
    if (used === 0) used = length;
    else if (used + 1 + length <= perLine) used += 1 + length;
    else {
      lines++;
      used = length;
    }
    // A word longer than a line breaks where it must.
    while (used > perLine) {
      lines++;
      used -= perLine;
    }
  }
  return lines;
}

/**
 * Row heights that fit each issue's longest wrapped text (message, fix, value…) in the
 * column widths, so that no message is cut off and no row is taller than its text needs;
 * at least one line, at most eight.
 */
export function rowHeightsFor(
  items: readonly Pick<Issue, 'column' | 'value' | 'title' | 'message' | 'fix'>[],
  widths: readonly number[],
): number[] {
  // Columns 2 to 6 hold wrapped text: column, value as given, problem, message, fix.
  const texts = (i: (typeof items)[number]) => [i.column, i.value, i.title, i.message, i.fix];
  return items.map((item) => {
    let lines = 1;
    texts(item).forEach((text, k) => {
      const width = Math.max(20, (widths[k + 2] ?? 120) - CELL_PADDING);
      const perLine = Math.max(1, Math.floor(width / CHAR_WIDTH));
      lines = Math.max(lines, wrappedLines(text ?? '', perLine));
    });
    return Math.min(MAX_ROW_HEIGHT, Math.max(ROW_HEIGHT, lines * LINE_HEIGHT + ROW_PADDING));
  });
}

/** The width of an element, kept up to date (0 until it is measured). */
function useWidth() {
  const [element, setElement] = useState<HTMLDivElement | null>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    if (!element || typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver(([entry]) =>
      setWidth(Math.floor(entry?.contentRect.width ?? 0)),
    );
    observer.observe(element);
    return () => observer.disconnect();
  }, [element]);
  return [setElement, width] as const;
}

const sorts: { value: IssueSort; label: string }[] = [
  { value: 'row', label: 'Row, first to last' },
  { value: '-row', label: 'Row, last to first' },
  { value: 'severity', label: 'Kind, row errors first' },
  { value: '-severity', label: 'Kind, warnings first' },
  { value: 'code', label: 'Problem, grouped' },
  { value: '-code', label: 'Problem, grouped, reversed' },
  { value: 'column', label: 'Column, A to Z' },
  { value: '-column', label: 'Column, Z to A' },
];

interface Props {
  submission: Submission;
  filters: IssueFilters;
  onChange: (next: IssueFilters) => void;
}

/** Every issue of the report, filtered, sorted and paged by the server. */
export function IssuesTable({ submission, filters, onChange }: Props) {
  const [boxRef, boxWidth] = useWidth();
  const issues = useIssues(submission.practice.id, submission.id, filters, true);
  const page = issues.data;
  const items: Issue[] = useMemo(() => page?.items ?? [], [page]);
  const offset = filters.offset ?? 0;
  const total = page?.total ?? 0;
  const codes = submission.issuesByCode.filter(
    (c) => c.severity !== 'refusal' && (!filters.severity || c.severity === filters.severity),
  );
  const set = (patch: Partial<IssueFilters>) => onChange({ ...filters, offset: 0, ...patch });
  const filtered = Boolean(filters.severity || filters.code || filters.column);
  const widths = useMemo(() => fillWidths(boxWidth), [boxWidth]);
  const rowHeights = useMemo(() => rowHeightsFor(items, widths), [items, widths]);

  const text = (
    row: number,
    value: (i: Issue) => string | null,
    tooltip?: (i: Issue) => string,
  ) => {
    const item = items[row];
    const content = item ? (value(item) ?? '') : '';
    return (
      <Cell wrapText tooltip={(item && tooltip?.(item)) || content || undefined}>
        {content}
      </Cell>
    );
  };

  return (
    <section className="cairn-issues" aria-labelledby="cairn-issues-heading">
      <h2 id="cairn-issues-heading" className="bp6-heading">
        Issues, row by row
      </h2>
      <div className="cairn-filters" role="search" aria-label="Filter the issues">
        <HTMLSelect
          aria-label="Kind of issue"
          value={filters.severity ?? ''}
          onChange={(e) =>
            set({ severity: e.currentTarget.value as IssueFilters['severity'], code: '' })
          }
        >
          <option value="">Every kind</option>
          <option value="error">{severityLook.error.plural} (row refused)</option>
          <option value="warning">{severityLook.warning.plural} (row kept)</option>
          <option value="flag">{severityLook.flag.plural} (row kept)</option>
        </HTMLSelect>
        <HTMLSelect
          aria-label="Problem"
          value={filters.code ?? ''}
          onChange={(e) => set({ code: e.currentTarget.value })}
        >
          <option value="">Every problem</option>
          {codes.map((c) => (
            <option key={c.code} value={c.code}>
              {c.title} ({formatCount(c.count)})
            </option>
          ))}
        </HTMLSelect>
        <HTMLSelect
          aria-label="Column"
          value={filters.column ?? ''}
          onChange={(e) => set({ column: e.currentTarget.value })}
        >
          <option value="">Every column</option>
          {(page?.columns ?? []).map((c) => (
            <option key={c.column} value={c.column}>
              {c.column} ({formatCount(c.count)})
            </option>
          ))}
        </HTMLSelect>
        <HTMLSelect
          aria-label="Sort by"
          value={filters.sort ?? 'row'}
          onChange={(e) => set({ sort: e.currentTarget.value as IssueSort })}
        >
          {sorts.map((s) => (
            <option key={s.value} value={s.value}>
              Sort: {s.label}
            </option>
          ))}
        </HTMLSelect>
        {filtered ? (
          <Button
            variant="minimal"
            icon="filter-remove"
            onClick={() => set({ severity: '', code: '', column: '' })}
          >
            Clear filters
          </Button>
        ) : null}
        <span className="cairn-muted cairn-count" aria-live="polite">
          {page
            ? total === 0
              ? 'No issues'
              : `${formatCount(offset + 1)}–${formatCount(offset + items.length)} of ${formatCount(total)} ${total === 1 ? 'issue' : 'issues'}`
            : ''}
        </span>
      </div>
      {page && !page.recordRefsShown ? (
        <Notice icon="eye-off" compact className="cairn-note">
          Record references are shown as pseudonyms: only the practice&apos;s own leads see them as
          given.
        </Notice>
      ) : null}
      <ProblemCallout error={issues.error} />
      {issues.isPending ? (
        <Spinner aria-label="Loading the issues" />
      ) : items.length === 0 ? (
        <EmptyState
          icon={filtered ? 'filter' : 'tick-circle'}
          title={filtered ? 'No issues match' : 'No issues'}
          description={filtered ? 'Change or clear the filters.' : 'Every row was read cleanly.'}
        />
      ) : (
        <div
          ref={boxRef}
          className="cairn-issues-table"
          style={{ height: rowHeights.slice(0, 10).reduce((a, b) => a + b, 0) + 32 }}
          aria-busy={issues.isFetching}
        >
          <Table2
            numRows={items.length}
            defaultRowHeight={ROW_HEIGHT}
            rowHeights={rowHeights}
            enableRowHeader={false}
            enableRowResizing={false}
            columnWidths={widths}
            cellRendererDependencies={[items, boxWidth]}
          >
            <Column
              name="Row"
              cellRenderer={(row) => text(row, (i) => (i.row === null ? 'file' : String(i.row)))}
            />
            <Column
              name="Kind"
              cellRenderer={(row) => (
                <Cell>{items[row] ? <SeverityTag severity={items[row].severity} /> : null}</Cell>
              )}
            />
            <Column name="Column" cellRenderer={(row) => text(row, (i) => i.column)} />
            <Column name="Value as given" cellRenderer={(row) => text(row, (i) => i.value)} />
            <Column
              name="Problem"
              cellRenderer={(row) =>
                text(
                  row,
                  (i) => i.title,
                  // The code stays available for support, as the cell's tooltip.
                  (i) => `${i.title} (code: ${i.code})`,
                )
              }
            />
            <Column name="What is wrong" cellRenderer={(row) => text(row, (i) => i.message)} />
            <Column name="How to fix it" cellRenderer={(row) => text(row, (i) => i.fix)} />
          </Table2>
        </div>
      )}
      {total > ISSUE_PAGE ? (
        <ButtonGroup className="cairn-pager">
          <Button
            icon="chevron-left"
            disabled={offset === 0}
            onClick={() => onChange({ ...filters, offset: Math.max(offset - ISSUE_PAGE, 0) })}
          >
            Previous {ISSUE_PAGE}
          </Button>
          <Button
            endIcon="chevron-right"
            disabled={offset + ISSUE_PAGE >= total}
            onClick={() => onChange({ ...filters, offset: offset + ISSUE_PAGE })}
          >
            Next {ISSUE_PAGE}
          </Button>
        </ButtonGroup>
      ) : null}
    </section>
  );
}
