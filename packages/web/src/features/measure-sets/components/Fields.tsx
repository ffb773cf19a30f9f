/** Form fields bound to a path of the value being edited, each showing its own problem. */
import { Checkbox, FormGroup, HTMLSelect, InputGroup, Intent, TextArea } from '@blueprintjs/core';
import type { ReactNode } from 'react';
import { getAt } from './form-state';

export interface FieldContext {
  value: unknown;
  set: (path: string, next: unknown) => void;
  problems: Map<string, string>;
  /** Prefix of element ids in this form */
  idPrefix: string;
}

const idOf = (ctx: FieldContext, path: string) =>
  `${ctx.idPrefix}-${path.replace(/[^a-zA-Z0-9]+/g, '-')}`;

function Group({
  ctx,
  path,
  label,
  hint,
  inline,
  children,
}: {
  ctx: FieldContext;
  path: string;
  label: string;
  hint?: ReactNode;
  inline?: boolean;
  children: ReactNode;
}) {
  const problem = ctx.problems.get(path);
  return (
    <FormGroup
      label={label}
      labelFor={idOf(ctx, path)}
      inline={inline}
      intent={problem ? Intent.DANGER : Intent.NONE}
      helperText={
        problem || hint ? <span id={`${idOf(ctx, path)}-help`}>{problem ?? hint}</span> : undefined
      }
      className="cairn-field"
      data-field={path}
    >
      {children}
    </FormGroup>
  );
}

const described = (ctx: FieldContext, path: string, hint?: ReactNode) =>
  ctx.problems.has(path) || hint ? `${idOf(ctx, path)}-help` : undefined;

export function TextField({
  ctx,
  path,
  label,
  hint,
  multiline,
  optional,
}: {
  ctx: FieldContext;
  path: string;
  label: string;
  hint?: ReactNode;
  multiline?: boolean;
  /** Empty text removes the field */
  optional?: boolean;
}) {
  const value = String(getAt(ctx.value, path) ?? '');
  const problem = ctx.problems.has(path);
  const change = (next: string) => ctx.set(path, optional && next === '' ? undefined : next);
  return (
    <Group ctx={ctx} path={path} label={label} hint={hint}>
      {multiline ? (
        <TextArea
          id={idOf(ctx, path)}
          value={value}
          onChange={(e) => change(e.currentTarget.value)}
          fill
          autoResize
          intent={problem ? Intent.DANGER : Intent.NONE}
          aria-invalid={problem || undefined}
          aria-describedby={described(ctx, path, hint)}
        />
      ) : (
        <InputGroup
          id={idOf(ctx, path)}
          value={value}
          onValueChange={change}
          intent={problem ? Intent.DANGER : Intent.NONE}
          aria-invalid={problem || undefined}
          aria-describedby={described(ctx, path, hint)}
        />
      )}
    </Group>
  );
}

export function NumberField({
  ctx,
  path,
  label,
  unit,
  hint,
  placeholder,
}: {
  ctx: FieldContext;
  path: string;
  label: string;
  unit?: string;
  hint?: ReactNode;
  placeholder?: string;
}) {
  const raw = getAt(ctx.value, path);
  const problem = ctx.problems.has(path);
  return (
    <Group ctx={ctx} path={path} label={label} hint={hint}>
      <InputGroup
        id={idOf(ctx, path)}
        value={raw === null || raw === undefined ? '' : String(raw)}
        onValueChange={(next) => ctx.set(path, next)}
        inputMode="decimal"
        placeholder={placeholder}
        rightElement={unit ? <span className="cairn-unit">{unit}</span> : undefined}
        intent={problem ? Intent.DANGER : Intent.NONE}
        aria-invalid={problem || undefined}
        aria-describedby={described(ctx, path, hint)}
        className="cairn-number-input"
      />
    </Group>
  );
}

export function ChoiceField<T extends string>({
  ctx,
  path,
  label,
  options,
  hint,
}: {
  ctx: FieldContext;
  path: string;
  label: string;
  options: readonly { value: T; label: string }[];
  hint?: ReactNode;
}) {
  const problem = ctx.problems.has(path);
  return (
    <Group ctx={ctx} path={path} label={label} hint={hint}>
      <HTMLSelect
        id={idOf(ctx, path)}
        value={String(getAt(ctx.value, path) ?? '')}
        onChange={(e) => ctx.set(path, e.currentTarget.value)}
        aria-invalid={problem || undefined}
        aria-describedby={described(ctx, path, hint)}
        fill
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </HTMLSelect>
    </Group>
  );
}

/** A list of strings chosen from options (diabetes types, the parts of a composite). */
export function ChecklistField<T extends string>({
  ctx,
  path,
  label,
  options,
  hint,
}: {
  ctx: FieldContext;
  path: string;
  label: string;
  options: readonly { value: T; label: string }[];
  hint?: ReactNode;
}) {
  const chosen = (getAt(ctx.value, path) as T[] | undefined) ?? [];
  const problem = ctx.problems.get(path);
  const id = idOf(ctx, path);
  return (
    <fieldset
      className={`cairn-field cairn-checklist${problem ? ' cairn-field-problem' : ''}`}
      data-field={path}
      aria-describedby={problem || hint ? `${id}-help` : undefined}
    >
      <legend>{label}</legend>
      {options.map((o) => (
        <Checkbox
          key={o.value}
          label={o.label}
          checked={chosen.includes(o.value)}
          onChange={(e) =>
            ctx.set(
              path,
              e.currentTarget.checked
                ? options.map((x) => x.value).filter((v) => v === o.value || chosen.includes(v))
                : chosen.filter((v) => v !== o.value),
            )
          }
        />
      ))}
      {problem || hint ? (
        <div
          id={`${id}-help`}
          className={`bp6-form-helper-text${problem ? ' cairn-problem-text' : ''}`}
        >
          {problem ?? hint}
        </div>
      ) : null}
    </fieldset>
  );
}

/** A yes/no value (stored as true or false). */
export function YesNoField({
  ctx,
  path,
  label,
}: {
  ctx: FieldContext;
  path: string;
  label: string;
}) {
  const problem = ctx.problems.has(path);
  const value = getAt(ctx.value, path) !== false;
  return (
    <Group ctx={ctx} path={path} label={label}>
      <HTMLSelect
        id={idOf(ctx, path)}
        value={value ? 'yes' : 'no'}
        onChange={(e) => ctx.set(path, e.currentTarget.value === 'yes')}
        aria-invalid={problem || undefined}
        aria-describedby={described(ctx, path)}
      >
        <option value="yes">Yes</option>
        <option value="no">No</option>
      </HTMLSelect>
    </Group>
  );
}
