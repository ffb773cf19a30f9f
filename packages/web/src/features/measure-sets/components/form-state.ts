/**
 * Editing a part of a measure-set definition in a form: values read and
 * written by path (`bands[1].systolicBelow`), numbers typed as text and
 * turned back into numbers when the form is sent, and the API's field
 * problems (`definition.targets[3].threshold`) brought back to the field of
 * the form that caused them.
 */

type Bag = Record<string, unknown>;

function steps(path: string): (string | number)[] {
  const out: (string | number)[] = [];
  for (const part of path.split('.')) {
    const m = /^([^[]*)((?:\[\d+\])*)$/.exec(part);
    if (!m) continue;
    if (m[1]) out.push(m[1]);
    for (const index of m[2]!.matchAll(/\[(\d+)\]/g)) out.push(Number(index[1]));
  }
  return out;
}

export function getAt(value: unknown, path: string): unknown {
  let here: unknown = value;
  for (const step of steps(path)) {
    if (here === null || typeof here !== 'object') return undefined;
    here = (here as Bag)[step as string];
  }
  return here;
}

/** A copy of `value` with `path` set (or removed, for undefined). */
export function setAt<T>(value: T, path: string, next: unknown): T {
  const copy = structuredClone(value);
  const all = steps(path);
  let here = copy as unknown as Bag;
  for (const step of all.slice(0, -1)) here = here[step as string] as Bag;
  const last = all[all.length - 1]!;
  if (next === undefined) delete here[last as string];
  else here[last as string] = next;
  return copy;
}

/** A number field: its path, and whether empty means "none" (null) rather than a mistake. */
export interface NumberPath {
  path: string;
  nullable: boolean;
}

/**
 * Turns the text typed into number fields back into numbers. Returns the
 * value and the fields that hold no number, with why.
 */
export function numbersFromText<T>(
  value: T,
  paths: NumberPath[],
): { value: T; problems: Map<string, string> } {
  let out = value;
  const problems = new Map<string, string>();
  for (const { path, nullable } of paths) {
    const raw = getAt(out, path);
    if (typeof raw === 'number' || raw === null) continue;
    const text = String(raw ?? '')
      .trim()
      .replace(',', '.');
    if (text === '') {
      if (nullable) out = setAt(out, path, null);
      else problems.set(path, 'Enter a number.');
      continue;
    }
    const n = Number(text);
    if (!Number.isFinite(n)) {
      problems.set(path, `“${String(raw)}” is not a number.`);
      continue;
    }
    out = setAt(out, path, n);
  }
  return { value: out, problems };
}

/**
 * The API's problems that fall under `prefix` (e.g. `definition.targets[3]`),
 * by the path within it; each is kept under the deepest path the form shows
 * (a problem with `of[2]` of a list shown as one field goes to `of`).
 */
export function problemsUnder(
  problems: Map<string, string>,
  prefix: string,
  shown: ReadonlySet<string>,
): { byField: Map<string, string>; elsewhere: [string, string][] } {
  const byField = new Map<string, string>();
  const elsewhere: [string, string][] = [];
  for (const [field, message] of problems) {
    if (field !== prefix && !field.startsWith(`${prefix}.`) && !field.startsWith(`${prefix}[`)) {
      elsewhere.push([field, message]);
      continue;
    }
    let path = field.slice(prefix.length).replace(/^\./, '');
    while (path && !shown.has(path)) {
      const shorter = path.replace(/(\.[^.[\]]+|\[\d+\])$/, '');
      if (shorter === path) break;
      path = shorter;
    }
    if (path && shown.has(path) && !byField.has(path)) byField.set(path, message);
    else elsewhere.push([field, message]);
  }
  return { byField, elsewhere };
}
