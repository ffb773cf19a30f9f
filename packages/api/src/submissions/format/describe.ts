/**
 * Plain-language descriptions of each column, shared by the template's data
 * dictionary, the API's format endpoint and docs/extract-format.md.
 */
import { COLUMNS, type ColumnDef, unitsOf } from './columns.js';

export function allowedValues(def: ColumnDef): string {
  switch (def.kind) {
    case 'ref':
      return 'text, up to 64 characters, not starting with = + - or @';
    case 'year':
      return 'a four-digit year';
    case 'code':
      return (def.codes ?? []).map((c) => `${c.value} (${c.label})`).join('; ');
    case 'date':
      return 'a date: a date cell, YYYY-MM-DD, DD/MM/YYYY (say the order when uploading), YYYY-MM or “14 May 2026”';
    case 'number': {
      const units = unitsOf(def).map((u) => u.code);
      const range = def.range ? `; plausible ${def.range.min}–${def.range.max} ${units[0]}` : '';
      return `a number in ${units.join(' or ')}${range}`;
    }
    case 'yesno':
      return 'yes / no (y/n, true/false, 1/0)';
    case 'unit':
      return unitsOf(def)
        .map((u) => u.code)
        .join(', ');
  }
}

export function requiredLabel(def: ColumnDef): string {
  if (def.valueRequired) return 'column and value required';
  if (def.required) return 'column required, may be blank';
  return 'optional column';
}

/** Drop-down values for the template's data validation. */
export function dropDownValues(def: ColumnDef): string[] | null {
  if (def.kind === 'code') return (def.codes ?? []).map((c) => c.value);
  if (def.kind === 'yesno') return ['yes', 'no'];
  if (def.kind === 'unit') return unitsOf(def).map((u) => u.code);
  return null;
}

export interface ColumnDescription {
  key: string;
  group: string;
  meaning: string;
  allowed: string;
  required: string;
  example: string;
}

export function describeColumns(): ColumnDescription[] {
  return COLUMNS.map((def) => ({
    key: def.key,
    group: def.group,
    meaning: def.meaning,
    allowed: allowedValues(def),
    required: requiredLabel(def),
    example: def.example,
  }));
}
