/**
 * The fields of one measure of a draft, by its rule: labels and source text,
 * denominator kind, direction, population filters, and the rule's own
 * values (window, composite list, threshold, blood pressure bands, parts).
 */
import { Button, Classes, FormGroup, HTMLSelect, Intent } from '@blueprintjs/core';
import {
  comparatorValues,
  type CareProcessDefinition,
  type ConditionDefinition,
  type MeasureSetDefinition,
  type TargetDefinition,
} from '../../../lib/api/types';
import {
  ChecklistField,
  ChoiceField,
  type FieldContext,
  NumberField,
  TextField,
  YesNoField,
} from './Fields';
import type { NumberPath } from './form-state';
import {
  comparatorWords,
  denominatorWords,
  directionWords,
  flagWords,
  measurementWords,
  typeWords,
} from './words';

export type MeasureDefinition = CareProcessDefinition | TargetDefinition;
export type MeasureList = 'careProcesses' | 'targets';

/** The parts of a composite target (a composite care process lists keys instead). */
function targetParts(m: MeasureDefinition, list: MeasureList): ConditionDefinition[] | null {
  return list === 'targets' && (m.rule === 'anyOf' || m.rule === 'allOf')
    ? (m.of as ConditionDefinition[])
    : null;
}

type Band = { minAge: number; systolicBelow: number; diastolicBelow: number };

/** The number fields of a measure (what numbersFromText turns back into numbers). */
export function measureNumbers(m: MeasureDefinition, list: MeasureList): NumberPath[] {
  const out: NumberPath[] = [
    { path: 'population.minAge', nullable: true },
    { path: 'population.maxAge', nullable: true },
  ];
  const bands = (prefix: string, list: Band[]) =>
    list.forEach((_, k) =>
      ['minAge', 'systolicBelow', 'diastolicBelow'].forEach((f) =>
        out.push({ path: `${prefix}bands[${k}].${f}`, nullable: false }),
      ),
    );
  if (m.rule === 'value') out.push({ path: 'threshold', nullable: false });
  if (m.rule === 'bloodPressure') bands('', m.bands);
  const parts = targetParts(m, list);
  if (parts) {
    parts.forEach((c, j) => {
      if (c.rule === 'value') out.push({ path: `of[${j}].threshold`, nullable: false });
      if (c.rule === 'bloodPressure') bands(`of[${j}].`, c.bands);
    });
  }
  return out;
}

/** Every path the form shows a field for. */
export function measureFields(m: MeasureDefinition, list: MeasureList): Set<string> {
  const out = new Set([
    'key',
    'label',
    'source',
    'note',
    'denominator',
    'direction',
    'population.types',
    'population.minAge',
    'population.maxAge',
    'rule',
  ]);
  for (const n of measureNumbers(m, list)) out.add(n.path);
  if (m.rule === 'recorded') out.add('window');
  if (m.rule === 'value') out.add('comparator');
  if (m.rule === 'flag') out.add('equals');
  if (m.rule === 'anyOf' || m.rule === 'allOf') out.add('of');
  targetParts(m, list)?.forEach((c, j) => {
    out.add(`of[${j}]`);
    if (c.rule === 'value') out.add(`of[${j}].comparator`);
    if (c.rule === 'flag') out.add(`of[${j}].equals`);
    if (c.rule === 'target') out.add(`of[${j}].key`);
  });
  return out;
}

function Bands({ ctx, prefix, bands }: { ctx: FieldContext; prefix: string; bands: Band[] }) {
  return (
    <div className="cairn-bands">
      {bands.map((_, k) => (
        <fieldset key={k} className="cairn-band">
          <legend>
            Band {k + 1}
            {k === 0 ? ' (from age 0)' : ''}
          </legend>
          <NumberField
            ctx={ctx}
            path={`${prefix}bands[${k}].minAge`}
            label="From age"
            unit="years"
          />
          <NumberField
            ctx={ctx}
            path={`${prefix}bands[${k}].systolicBelow`}
            label="Systolic below"
            unit="mmHg"
          />
          <NumberField
            ctx={ctx}
            path={`${prefix}bands[${k}].diastolicBelow`}
            label="Diastolic below"
            unit="mmHg"
          />
        </fieldset>
      ))}
    </div>
  );
}

const comparatorOptions = comparatorValues.map((c) => ({ value: c, label: comparatorWords[c] }));

function Part({
  ctx,
  j,
  part,
  earlier,
  onRemove,
}: {
  ctx: FieldContext;
  j: number;
  part: ConditionDefinition;
  earlier: TargetDefinition[];
  onRemove: () => void;
}) {
  const at = `of[${j}]`;
  const problem = ctx.problems.get(at);
  return (
    <fieldset className="cairn-part" data-field={at}>
      <legend>Part {j + 1}</legend>
      {part.rule === 'target' ? (
        <ChoiceField
          ctx={ctx}
          path={`${at}.key`}
          label="Treatment target met"
          options={earlier.map((t) => ({ value: t.key, label: `${t.label} (${t.key})` }))}
        />
      ) : part.rule === 'value' ? (
        <div className="cairn-field-row">
          <p className="cairn-part-what">Latest {measurementWords[part.measurement].label}</p>
          <ChoiceField
            ctx={ctx}
            path={`${at}.comparator`}
            label="Comparison"
            options={comparatorOptions}
          />
          <NumberField
            ctx={ctx}
            path={`${at}.threshold`}
            label="Threshold"
            unit={measurementWords[part.measurement].unit}
          />
        </div>
      ) : part.rule === 'flag' ? (
        <YesNoField
          ctx={ctx}
          path={`${at}.equals`}
          label={`${flagWords[part.flag] ?? part.flag}: met when recorded as`}
        />
      ) : (
        <Bands ctx={ctx} prefix={`${at}.`} bands={part.bands} />
      )}
      {problem ? <p className={`${Classes.TEXT_SMALL} cairn-problem-text`}>{problem}</p> : null}
      <Button small variant="minimal" icon="trash" intent={Intent.DANGER} onClick={onRemove}>
        Remove part {j + 1}
      </Button>
    </fieldset>
  );
}

export function MeasureForm({
  ctx,
  measure,
  definition,
  list,
  index,
}: {
  ctx: FieldContext;
  measure: MeasureDefinition;
  definition: MeasureSetDefinition;
  list: MeasureList;
  /** Index in its list */
  index: number;
}) {
  const recorded = definition.careProcesses.filter((p) => p.rule === 'recorded');
  const earlierTargets = list === 'targets' ? definition.targets.slice(0, index) : [];
  const parts = targetParts(measure, list);
  return (
    <div className="cairn-measure-form">
      <div className="cairn-field-row">
        <TextField ctx={ctx} path="label" label="Label" />
        <TextField
          ctx={ctx}
          path="key"
          label="Key"
          hint="Lower case letters, digits and _; composites name measures by key."
        />
      </div>
      <TextField
        ctx={ctx}
        path="source"
        label="Guideline source"
        multiline
        hint="The guideline or rule the measure comes from, as readers will see it."
      />
      <TextField ctx={ctx} path="note" label="Note (optional)" multiline optional />

      {measure.rule === 'recorded' ? (
        <ChoiceField
          ctx={ctx}
          path="window"
          label="Counted when recorded in"
          options={[
            { value: 'review', label: 'The review window (12 months ending with the quarter)' },
            { value: 'retinal', label: 'The retinal window' },
          ]}
        />
      ) : null}

      {list === 'careProcesses' && measure.rule === 'allOf' ? (
        <ChecklistField
          ctx={ctx}
          path="of"
          label="Care processes that must all be recorded"
          options={recorded.map((p) => ({ value: p.key, label: p.label }))}
        />
      ) : null}

      {measure.rule === 'value' ? (
        <div className="cairn-field-row">
          <p className="cairn-part-what">
            Latest {measurementWords[measure.measurement].label} in the review window
          </p>
          <ChoiceField ctx={ctx} path="comparator" label="Comparison" options={comparatorOptions} />
          <NumberField
            ctx={ctx}
            path="threshold"
            label="Threshold"
            unit={measurementWords[measure.measurement].unit}
          />
        </div>
      ) : null}

      {measure.rule === 'bloodPressure' ? (
        <FormGroup label="Blood pressure bands (met when both readings are below the band's limits)">
          <Bands ctx={ctx} prefix="" bands={measure.bands} />
        </FormGroup>
      ) : null}

      {measure.rule === 'flag' ? (
        <YesNoField
          ctx={ctx}
          path="equals"
          label={`${flagWords[measure.flag] ?? measure.flag}: met when recorded as`}
        />
      ) : null}

      {parts ? <CompositeParts ctx={ctx} parts={parts} earlier={earlierTargets} /> : null}

      <div className="cairn-field-row">
        <ChoiceField
          ctx={ctx}
          path="denominator"
          label="Denominator"
          options={(['eligible', 'measured'] as const).map((d) => ({
            value: d,
            label: denominatorWords[d],
          }))}
        />
        <ChoiceField
          ctx={ctx}
          path="direction"
          label="Direction"
          options={(['higher', 'lower'] as const).map((d) => ({
            value: d,
            label: directionWords[d],
          }))}
        />
      </div>
      <ChecklistField
        ctx={ctx}
        path="population.types"
        label="Population: diabetes types"
        options={(['type1', 'type2', 'other'] as const).map((t) => ({
          value: t,
          label: typeWords[t],
        }))}
      />
      <div className="cairn-field-row">
        <NumberField
          ctx={ctx}
          path="population.minAge"
          label="Youngest age"
          unit="years"
          placeholder="no lower bound"
          hint="Empty: no lower bound."
        />
        <NumberField
          ctx={ctx}
          path="population.maxAge"
          label="Oldest age"
          unit="years"
          placeholder="no upper bound"
          hint="Empty: no upper bound."
        />
      </div>
    </div>
  );
}

function CompositeParts({
  ctx,
  parts,
  earlier,
}: {
  ctx: FieldContext;
  parts: ConditionDefinition[];
  earlier: TargetDefinition[];
}) {
  const included = new Set(parts.flatMap((p) => (p.rule === 'target' ? [p.key] : [])));
  const addable = earlier.filter((t) => !included.has(t.key));
  const problem = ctx.problems.get('of');
  return (
    <div className="cairn-parts" data-field="of">
      <ChoiceField
        ctx={ctx}
        path="rule"
        label="Met when"
        options={[
          { value: 'allOf', label: 'Every part is met' },
          { value: 'anyOf', label: 'At least one part is met' },
        ]}
      />
      {parts.map((part, j) => (
        <Part
          key={j}
          ctx={ctx}
          j={j}
          part={part}
          earlier={earlier}
          onRemove={() =>
            ctx.set(
              'of',
              parts.filter((_, k) => k !== j),
            )
          }
        />
      ))}
      {problem ? (
        <p className="cairn-problem-text" id={`${ctx.idPrefix}-of-help`}>
          {problem}
        </p>
      ) : null}
      {addable.length > 0 ? (
        <FormGroup label="Add a target as a part" labelFor={`${ctx.idPrefix}-add-part`} inline>
          <HTMLSelect
            id={`${ctx.idPrefix}-add-part`}
            value=""
            onChange={(e) => {
              const key = e.currentTarget.value;
              if (key) ctx.set('of', [...parts, { rule: 'target', key }]);
            }}
          >
            <option value="">Choose a target…</option>
            {addable.map((t) => (
              <option key={t.key} value={t.key}>
                {t.label}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
      ) : null}
    </div>
  );
}
