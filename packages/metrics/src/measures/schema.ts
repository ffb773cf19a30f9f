import { z } from 'zod';
import { CARE_PROCESS_FIELDS } from '../records/record.js';
import { thresholdProblem } from './threshold-ranges.js';

/**
 * Measure sets as data (methods §2–3). A measure set is a versioned list of care processes and
 * treatment targets; every threshold, window and population filter lives here, not in code, so
 * that a region can publish its own version. `parseMeasureSet` validates a parsed JSON value and
 * refuses an invalid one with messages that name the path and the problem, e.g.
 * `targets[3].threshold: expected a number, got a string`.
 *
 * Outcomes are three-valued: a condition is met, not met, or unknown (no measurement in the
 * window, or a flag not recorded). With denominator `eligible` everyone in the measure's
 * population counts and unknown counts as not met; with `measured` only those with a known
 * outcome count. Events are the same under both.
 */

const KEY = /^[a-z][a-z0-9_]*$/;
const ID = /^[a-z][a-z0-9-]*-\d{4}\.\d+$/;

const typeSchema = z.enum(['type1', 'type2', 'other']);

const populationSchema = z
  .object({
    /** Diabetes types included. */
    types: z.array(typeSchema).min(1),
    /** Inclusive age range at the end of the review window; null for no bound. */
    minAge: z.number().int().min(0).max(150).nullable(),
    maxAge: z.number().int().min(0).max(150).nullable(),
  })
  .strict();

const common = {
  key: z.string().max(64).regex(KEY, 'must be lower case letters, digits and _ (e.g. hba1c_le_53)'),
  label: z.string().trim().min(1).max(200),
  /** The guideline or rule the measure comes from, as text. */
  source: z.string().trim().min(1).max(2000),
  denominator: z.enum(['eligible', 'measured']),
  direction: z.enum(['higher', 'lower']),
  population: populationSchema,
  /** Optional explanation shown with the measure. */
  note: z.string().max(2000).optional(),
};

const recordedProcessSchema = z
  .object({
    ...common,
    rule: z.literal('recorded'),
    /** The record field whose month must lie in the window. */
    field: z.enum(CARE_PROCESS_FIELDS as unknown as [string, ...string[]]),
    /** 'review' (the 12-month review window) or 'retinal' (the retinal window). */
    window: z.enum(['review', 'retinal']),
  })
  .strict();

const compositeProcessSchema = z
  .object({
    ...common,
    rule: z.literal('allOf'),
    /** Keys of recorded care processes that must all be complete. */
    of: z.array(z.string()).min(1),
  })
  .strict();

const careProcessSchema = z.discriminatedUnion('rule', [
  recordedProcessSchema,
  compositeProcessSchema,
]);

const comparatorSchema = z.enum(['lt', 'le', 'gt', 'ge']);
const measurementSchema = z.enum([
  'hba1c',
  'systolic',
  'diastolic',
  'cholesterol',
  'serumCreatinine',
  'urineAlbumin',
  'bmi',
]);
const flagSchema = z.enum(['onStatin', 'onInsulin', 'cvdHistory']);

const valueCondition = {
  rule: z.literal('value'),
  /** Latest value in the review window, in canonical units (see records/record.ts). */
  measurement: measurementSchema,
  comparator: comparatorSchema,
  threshold: z.number(),
};

const bloodPressureBandSchema = z
  .object({
    /** The band applies from this age (inclusive) up to the next band's minAge. */
    minAge: z.number().int().min(0),
    systolicBelow: z.number().positive(),
    diastolicBelow: z.number().positive(),
  })
  .strict();

const bloodPressureCondition = {
  rule: z.literal('bloodPressure'),
  /** Age bands in ascending order; the first starts at age 0. */
  bands: z.array(bloodPressureBandSchema).min(1),
};

const flagCondition = {
  rule: z.literal('flag'),
  flag: flagSchema,
  /** The recorded value that meets the target (default true). */
  equals: z.boolean().default(true),
};

const conditionSchema = z.discriminatedUnion('rule', [
  z.object(valueCondition).strict(),
  z.object(bloodPressureCondition).strict(),
  z.object(flagCondition).strict(),
  z.object({ rule: z.literal('target'), key: z.string() }).strict(),
]);

const targetSchema = z.discriminatedUnion('rule', [
  z.object({ ...common, ...valueCondition }).strict(),
  z.object({ ...common, ...bloodPressureCondition }).strict(),
  z.object({ ...common, ...flagCondition }).strict(),
  z.object({ ...common, rule: z.literal('anyOf'), of: z.array(conditionSchema).min(1) }).strict(),
  z.object({ ...common, rule: z.literal('allOf'), of: z.array(conditionSchema).min(1) }).strict(),
]);

const measureSetSchema = z
  .object({
    $schema: z.string().optional(),
    /** Versioned id, e.g. 'cairn-default-2026.1'. */
    id: z.string().max(64).regex(ID, "must be a versioned id such as 'cairn-default-2026.1'"),
    label: z.string().trim().min(1).max(200),
    description: z.string().max(2000).optional(),
    eligibility: z
      .object({
        /** Minimum age at the end of the review window (methods §1: 12). */
        minAge: z.number().int().min(0).max(150),
      })
      .strict(),
    /** Months a retinal screening counts for (12, or 24 where low-risk people are screened two-yearly). */
    retinalWindowMonths: z.number().int().min(1).max(60),
    breakdowns: z
      .object({
        /** Lower bounds of the age bands, ascending (e.g. [12, 40, 65, 80]). */
        ageBands: z.array(z.number().int().min(0).max(150)).min(1),
        /** Lower bounds of the duration bands in whole years, ascending from 0 (e.g. [0, 2, 7, 15]). */
        durationBands: z.array(z.number().int().min(0).max(150)).min(1),
      })
      .strict(),
    careProcesses: z.array(careProcessSchema).min(1),
    targets: z.array(targetSchema),
  })
  .strict()
  .superRefine((set, ctx) => {
    const issue = (path: (string | number)[], message: string): void => {
      ctx.addIssue({ code: 'custom', path, message });
    };
    const seen = new Map<string, string>();
    const checkKey = (key: string, where: string, path: (string | number)[]): void => {
      const before = seen.get(key);
      if (before !== undefined) issue([...path, 'key'], `duplicate key "${key}" (also ${before})`);
      else seen.set(key, where);
    };
    const checkPopulation = (
      p: z.infer<typeof populationSchema>,
      path: (string | number)[],
    ): void => {
      if (p.minAge !== null && p.maxAge !== null && p.minAge > p.maxAge) {
        issue([...path, 'population', 'maxAge'], 'must not be below minAge');
      }
      if (new Set(p.types).size !== p.types.length) {
        issue([...path, 'population', 'types'], 'must not repeat a type');
      }
    };
    const ascending = (values: readonly number[], path: (string | number)[]): void => {
      for (let i = 1; i < values.length; i++) {
        if ((values[i] as number) <= (values[i - 1] as number)) {
          issue([...path, i], 'must be greater than the value before it');
        }
      }
    };
    ascending(set.breakdowns.ageBands, ['breakdowns', 'ageBands']);
    ascending(set.breakdowns.durationBands, ['breakdowns', 'durationBands']);
    if ((set.breakdowns.ageBands[0] as number) > set.eligibility.minAge) {
      issue(['breakdowns', 'ageBands', 0], 'must not be above eligibility.minAge');
    }
    if (set.breakdowns.durationBands[0] !== 0) {
      issue(['breakdowns', 'durationBands', 0], 'must be 0');
    }
    const recorded = new Set<string>();
    set.careProcesses.forEach((p, i) => {
      checkKey(p.key, `careProcesses[${i}]`, ['careProcesses', i]);
      checkPopulation(p.population, ['careProcesses', i]);
      if (p.rule === 'recorded') recorded.add(p.key);
    });
    set.careProcesses.forEach((p, i) => {
      if (p.rule !== 'allOf') return;
      p.of.forEach((key, j) => {
        if (!recorded.has(key)) {
          issue(['careProcesses', i, 'of', j], `"${key}" is not a recorded care process`);
        }
      });
    });
    const targetsBefore = new Set<string>();
    const checkBands = (
      bands: z.infer<typeof bloodPressureBandSchema>[],
      path: (string | number)[],
    ): void => {
      if (bands[0]?.minAge !== 0) issue([...path, 'bands', 0, 'minAge'], 'must be 0');
      ascending(
        bands.map((b) => b.minAge),
        [...path, 'bands'],
      );
      bands.forEach((b, k) => {
        const systolic = thresholdProblem('systolic', b.systolicBelow);
        if (systolic) issue([...path, 'bands', k, 'systolicBelow'], systolic);
        const diastolic = thresholdProblem('diastolic', b.diastolicBelow);
        if (diastolic) issue([...path, 'bands', k, 'diastolicBelow'], diastolic);
      });
    };
    const checkThreshold = (
      c: { measurement: z.infer<typeof measurementSchema>; threshold: number },
      path: (string | number)[],
    ): void => {
      const problem = thresholdProblem(c.measurement, c.threshold);
      if (problem) issue([...path, 'threshold'], problem);
    };
    set.targets.forEach((t, i) => {
      const path = ['targets', i];
      checkKey(t.key, `targets[${i}]`, path);
      checkPopulation(t.population, path);
      if (t.rule === 'bloodPressure') checkBands(t.bands, path);
      if (t.rule === 'value') checkThreshold(t, path);
      if (t.rule === 'anyOf' || t.rule === 'allOf') {
        t.of.forEach((c, j) => {
          if (c.rule === 'target' && !targetsBefore.has(c.key)) {
            issue([...path, 'of', j, 'key'], `"${c.key}" is not a target defined before this one`);
          }
          if (c.rule === 'bloodPressure') checkBands(c.bands, [...path, 'of', j]);
          if (c.rule === 'value') checkThreshold(c, [...path, 'of', j]);
        });
      }
      targetsBefore.add(t.key);
    });
    if (set.careProcesses.length + set.targets.length > 64) {
      issue([], 'a measure set holds at most 64 measures');
    }
  });

export type MeasureSet = z.infer<typeof measureSetSchema>;
export type CareProcessDefinition = MeasureSet['careProcesses'][number];
export type TargetDefinition = MeasureSet['targets'][number];
export type TargetCondition = z.infer<typeof conditionSchema>;
export type Population = z.infer<typeof populationSchema>;

export interface MeasureSetIssue {
  /** Path in the measure set, e.g. 'targets[3].threshold' ('(root)' for the whole value). */
  path: string;
  message: string;
}

/** The error thrown for an invalid measure set; `issues` lists every problem found. */
export class MeasureSetError extends Error {
  readonly issues: readonly MeasureSetIssue[];
  constructor(issues: readonly MeasureSetIssue[]) {
    super(`invalid measure set: ${issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
    this.name = 'MeasureSetError';
    this.issues = issues;
  }
}

function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out === '' ? String(part) : `.${String(part)}`;
  }
  return out === '' ? '(root)' : out;
}

function kindOf(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'an array';
  if (typeof value === 'object') return 'an object';
  if (typeof value === 'number' && Number.isNaN(value)) return 'NaN';
  return `a ${typeof value}`;
}

function withArticle(type: string): string {
  if (type === 'array' || type === 'object' || type === 'integer') return `an ${type}`;
  return `a ${type}`;
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let value: unknown = root;
  for (const part of path) {
    if (value === null || typeof value !== 'object') return undefined;
    value = (value as Record<PropertyKey, unknown>)[part];
  }
  return value;
}

function describeIssue(issue: z.core.$ZodIssue, root: unknown): MeasureSetIssue {
  const path = formatPath(issue.path);
  switch (issue.code) {
    case 'invalid_type': {
      const got = valueAt(root, issue.path);
      return {
        path,
        message:
          got === undefined
            ? `required (expected ${withArticle(issue.expected)})`
            : `expected ${withArticle(issue.expected)}, got ${kindOf(got)}`,
      };
    }
    case 'invalid_value':
      return {
        path,
        message: `expected one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`,
      };
    case 'invalid_union':
      if ('discriminator' in issue && issue.discriminator) {
        const options = (issue as { options?: unknown[] }).options ?? [];
        return {
          path: formatPath([...issue.path]),
          message: `expected one of ${options.map((v) => JSON.stringify(v)).join(', ')}`,
        };
      }
      return { path, message: 'does not match any allowed form' };
    case 'unrecognized_keys':
      return { path, message: `unknown field ${issue.keys.map((k) => `"${k}"`).join(', ')}` };
    case 'too_small':
      return {
        path,
        message:
          issue.origin === 'array'
            ? `must have at least ${String(issue.minimum)} item(s)`
            : issue.origin === 'string'
              ? 'must not be empty'
              : `must be ${issue.inclusive === false ? 'above' : 'at least'} ${String(issue.minimum)}`,
      };
    case 'too_big':
      return {
        path,
        message:
          issue.origin === 'array'
            ? `must have at most ${String(issue.maximum)} item(s)`
            : issue.origin === 'string'
              ? `must be at most ${String(issue.maximum)} characters long`
              : `must be ${issue.inclusive === false ? 'below' : 'at most'} ${String(issue.maximum)}`,
      };
    case 'invalid_format':
      return { path, message: issue.message };
    default:
      return { path, message: issue.message };
  }
}

/** Validates without throwing. */
export function safeParseMeasureSet(
  json: unknown,
): { ok: true; value: MeasureSet } | { ok: false; issues: MeasureSetIssue[] } {
  const result = measureSetSchema.safeParse(json);
  if (result.success) return { ok: true, value: result.data };
  return { ok: false, issues: result.error.issues.map((i) => describeIssue(i, json)) };
}

/**
 * Validates a parsed JSON value as a measure set and returns it typed; throws a
 * `MeasureSetError` naming every path and problem otherwise. Reads no files: the caller loads
 * the JSON and hands it in.
 */
export function parseMeasureSet(json: unknown): MeasureSet {
  const result = safeParseMeasureSet(json);
  if (!result.ok) throw new MeasureSetError(result.issues);
  return result.value;
}
