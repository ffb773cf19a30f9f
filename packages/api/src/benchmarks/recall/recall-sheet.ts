/**
 * A recall list as a table, for the CSV and XLSX downloads: the columns, and
 * each line's cells. Every text cell goes through `neutralise`, so that no
 * cell can start a formula when the file is opened (a reference or a value
 * beginning with = + − @ gets a leading apostrophe); numbers stay numbers.
 */
import { neutralise } from '../../common/neutralise.js';
import type { RecallItem } from './recall-item.js';

export const SEX_WORDS: Record<RecallItem['sex'], string> = {
  F: 'Female',
  M: 'Male',
  X: 'Another or indeterminate',
  U: 'Not recorded',
};

export const TYPE_WORDS: Record<RecallItem['diabetesType'], string> = {
  type1: 'Type 1',
  type2: 'Type 2',
  other: 'Other',
};

export type Cell = string | number | null;

export function recallColumns(showRecordRefs: boolean): string[] {
  return [
    showRecordRefs ? 'Reference' : 'Pseudonym',
    'Extract row',
    'Birth year',
    'Age band',
    'Sex',
    'Diabetes type',
    'Why listed',
    'Last recorded',
    'Value',
    'Detail',
  ];
}

const text = (value: string | null): Cell => (value === null ? null : neutralise(value));

export function recallCells(item: RecallItem): Cell[] {
  return [
    text(item.reference),
    item.row,
    item.birthYear,
    text(item.ageBand),
    text(SEX_WORDS[item.sex]),
    text(TYPE_WORDS[item.diabetesType]),
    text(item.reasonText),
    text(item.lastRecorded),
    text(item.value),
    text(item.detail),
  ];
}

/** One CSV line (RFC 4180 quoting, CRLF). */
export function csvLine(cells: readonly Cell[]): string {
  return (
    cells
      .map((cell) => {
        const value = cell === null ? '' : String(cell);
        return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
      })
      .join(',') + '\r\n'
  );
}
