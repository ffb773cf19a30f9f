/**
 * Matching an extract's heading row to Cairn's columns. Tolerant of case,
 * spaces and punctuation ("Birth Year", "birth-year"), of a unit suffix in
 * brackets or at the end ("HbA1c value (%)", "cholesterol_value_mg_dl"), and
 * of the aliases in columns.ts. Unknown headings are warnings; identifier-like
 * ones, a missing required column, a repeated column or a unit Cairn does not
 * know refuse the file. Every such problem of the heading row is found in one
 * pass and reported together, so that one corrected file answers them all.
 */
import {
  COLUMN_BY_KEY,
  COLUMNS,
  type ColumnDef,
  findUnit,
  REQUIRED_COLUMNS,
  type UnitDef,
} from './columns.js';
import { identifierKind } from './identifiers.js';

export interface NormalisedHeading {
  /** Lower case, words joined by '_' */
  name: string;
  /** The text of a bracketed suffix, e.g. '%' from "hba1c_value (%)" */
  unitText: string | null;
}

export function normaliseHeading(raw: string): NormalisedHeading {
  let text = raw.replace(/^\uFEFF/, '').trim();
  let unitText: string | null = null;
  const bracket = /[([]\s*([^)\]]*?)\s*[)\]]\s*$/.exec(text);
  if (bracket) {
    unitText = bracket[1] ?? '';
    text = text.slice(0, bracket.index);
  }
  const name = text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '');
  return { name, unitText };
}

const byName = new Map<string, ColumnDef>();
for (const def of COLUMNS) {
  byName.set(def.key, def);
  for (const alias of def.aliases ?? []) byName.set(alias, def);
}

/** Unit suffixes written as words at the end of a heading ("..._mg_dl", "..._percent"). */
function splitUnitSuffix(name: string): { base: string; unitText: string } | null {
  for (const def of COLUMNS) {
    if (!def.units) continue;
    for (const unit of def.units) {
      for (const alias of unit.aliases) {
        const suffix = alias
          .toLowerCase()
          .replace(/[^a-z0-9]+/g, '_')
          .replace(/^_+|_+$/g, '');
        if (suffix && name.endsWith(`_${suffix}`)) {
          const base = name.slice(0, -suffix.length - 1);
          if (byName.get(base) === def) return { base, unitText: alias };
        }
      }
    }
  }
  return null;
}

export interface MappedColumn {
  def: ColumnDef;
  /** 0-based position in the row */
  index: number;
  heading: string;
  /** A unit declared by the heading */
  headingUnit: UnitDef | null;
}

export type HeaderProblem =
  | { code: 'identifier_column'; headings: { heading: string; what: string; column: string }[] }
  | { code: 'missing_columns'; missing: string[] }
  | { code: 'duplicate_column'; key: string; headings: string[]; columns: string[] }
  | {
      code: 'unknown_unit_in_header';
      heading: string;
      unitText: string;
      key: string;
      allowed: string[];
    };

export interface HeaderWarning {
  code: 'unknown_column' | 'unnamed_column';
  heading: string;
  column: string;
}

export interface HeaderMapping {
  columns: MappedColumn[];
  byKey: Map<string, MappedColumn>;
  warnings: HeaderWarning[];
  /** Positions of columns Cairn ignores (unknown or unnamed), for blank-row detection */
  ignored: number[];
}

/** Spreadsheet column letters of a 0-based index: 0 → A, 26 → AA. */
export function columnLetter(index: number): string {
  let n = index + 1;
  let out = '';
  while (n > 0) {
    const rem = (n - 1) % 26;
    out = String.fromCharCode(65 + rem) + out;
    n = Math.floor((n - 1) / 26);
  }
  return out;
}

/** How many headings of a row name Cairn columns (used to find the heading row). */
export function knownHeadingCount(cells: readonly string[]): number {
  let n = 0;
  for (const cell of cells) {
    if (!cell) continue;
    const { name } = normaliseHeading(cell);
    if (byName.has(name) || splitUnitSuffix(name)) n++;
  }
  return n;
}

export function mapHeader(
  cells: readonly string[],
): { mapping: HeaderMapping } | { problems: HeaderProblem[] } {
  const identifiers: { heading: string; what: string; column: string }[] = [];
  const columns: MappedColumn[] = [];
  const warnings: HeaderWarning[] = [];
  const ignored: number[] = [];
  const seen = new Map<string, MappedColumn[]>();
  /** Columns named by a heading, even one refused for its unit (it is not also missing). */
  const named = new Set<string>();
  const unitProblems: HeaderProblem[] = [];

  cells.forEach((raw, index) => {
    const heading = (raw ?? '').trim();
    if (heading === '') {
      ignored.push(index);
      warnings.push({ code: 'unnamed_column', heading: '', column: columnLetter(index) });
      return;
    }
    const normalised = normaliseHeading(heading);
    let name = normalised.name;
    let unitText = normalised.unitText;
    let def = byName.get(name);
    if (!def) {
      const split = splitUnitSuffix(name);
      if (split) {
        name = split.base;
        unitText = split.unitText;
        def = byName.get(name);
      }
    }
    if (!def) {
      const what = identifierKind(name);
      if (what) identifiers.push({ heading, what, column: columnLetter(index) });
      else {
        ignored.push(index);
        warnings.push({ code: 'unknown_column', heading, column: columnLetter(index) });
      }
      return;
    }
    named.add(def.key);
    let headingUnit: UnitDef | null = null;
    if (unitText !== null && unitText !== '') {
      headingUnit = findUnit(def, unitText);
      if (!headingUnit) {
        // A bracketed note that is not a unit on a column without units is harmless ("sex (F/M)").
        if (def.units || def.unitFor) {
          unitProblems.push({
            code: 'unknown_unit_in_header',
            heading,
            unitText,
            key: def.key,
            allowed: (def.units ?? []).map((u) => u.code),
          });
          return;
        }
      }
    }
    const mapped: MappedColumn = { def, index, heading, headingUnit };
    columns.push(mapped);
    seen.set(def.key, [...(seen.get(def.key) ?? []), mapped]);
  });

  // In the order a person would fix them: what must not be sent first, then what is wrong, then what is missing.
  const problems: HeaderProblem[] = [];
  if (identifiers.length > 0) problems.push({ code: 'identifier_column', headings: identifiers });
  problems.push(...unitProblems);
  for (const [key, list] of seen) {
    if (list.length > 1) {
      problems.push({
        code: 'duplicate_column',
        key,
        headings: list.map((m) => m.heading),
        columns: list.map((m) => columnLetter(m.index)),
      });
    }
  }
  const missing = REQUIRED_COLUMNS.filter((key) => !named.has(key));
  if (missing.length > 0) problems.push({ code: 'missing_columns', missing });
  if (problems.length > 0) return { problems };

  // Unnamed columns at the end of the row are the spreadsheet's padding, not worth a warning.
  const trimmed = warnings.filter(
    (w) => w.code !== 'unnamed_column' || isBeforeLastHeading(w.column, cells),
  );
  return {
    mapping: {
      columns,
      byKey: new Map(columns.map((m) => [m.def.key, m])),
      warnings: trimmed,
      ignored,
    },
  };
}

function isBeforeLastHeading(letter: string, cells: readonly string[]): boolean {
  let last = -1;
  cells.forEach((c, i) => {
    if ((c ?? '').trim() !== '') last = i;
  });
  return columnIndexOf(letter) < last;
}

function columnIndexOf(letter: string): number {
  let n = 0;
  for (const ch of letter) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

export { COLUMN_BY_KEY };
