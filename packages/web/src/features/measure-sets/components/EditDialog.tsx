import { Button, Callout, Dialog, DialogBody, DialogFooter, Intent } from '@blueprintjs/core';
import { type FormEvent, type ReactNode, useState } from 'react';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { MeasureSet, MeasureSetDefinition } from '../../../lib/api/types';
import { fieldProblems } from '../../../lib/field-problems';
import { useSaveDraft } from '../api/measure-sets';
import type { FieldContext } from './Fields';
import { type NumberPath, numbersFromText, problemsUnder, setAt } from './form-state';

interface Props<T> {
  set: MeasureSet;
  title: string;
  /** Where the edited part lies in the definition ('' for the set itself) */
  at: string;
  /** The part as it is now */
  initial: T;
  numbers: (value: T) => NumberPath[];
  /** The paths the form shows a field for (problems elsewhere are listed at the top) */
  shown: (value: T) => ReadonlySet<string>;
  idPrefix: string;
  onClose: () => void;
  children: (ctx: FieldContext & { value: T }) => ReactNode;
}

/**
 * One form over a part of a draft (a measure, or the set's own settings). It
 * sends the whole definition with the part replaced; the API checks it with
 * the measure-set schema and names each problem's field, which the form
 * shows next to that field. Nothing is saved while any problem remains.
 */
export function EditDialog<T>({
  set,
  title,
  at,
  initial,
  numbers,
  shown,
  idPrefix,
  onClose,
  children,
}: Props<T>) {
  const save = useSaveDraft(set.id);
  const [value, setValue] = useState<T>(initial);
  const [local, setLocal] = useState<Map<string, string>>(new Map());
  const prefix = at ? `definition.${at}` : 'definition';
  const fields = shown(value);
  const { byField, elsewhere } = problemsUnder(fieldProblems(save.error), prefix, fields);
  const problems = new Map([...byField, ...local]);
  const count = problems.size + elsewhere.length;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const typed = numbersFromText(value, numbers(value));
    setLocal(typed.problems);
    if (typed.problems.size > 0) return;
    const definition: MeasureSetDefinition = at
      ? setAt(set.definition, at, typed.value)
      : ({ ...set.definition, ...(typed.value as object) } as MeasureSetDefinition);
    save.mutate({ revision: set.revision, definition }, { onSuccess: onClose });
  };

  const ctx = {
    value,
    set: (path: string, next: unknown) => {
      setValue((v) => setAt(v, path, next));
      setLocal((l) => {
        if (!l.has(path)) return l;
        const copy = new Map(l);
        copy.delete(path);
        return copy;
      });
    },
    problems,
    idPrefix,
  };

  return (
    <Dialog isOpen onClose={onClose} title={title} icon="edit" className="cairn-edit-dialog">
      <form onSubmit={submit} noValidate>
        <DialogBody>
          {count > 0 ? (
            <Callout
              intent={Intent.DANGER}
              icon="error"
              title={
                count === 1
                  ? 'One problem to fix; nothing was saved'
                  : `${count} problems to fix; nothing was saved`
              }
              className="cairn-form-problems"
              role="alert"
            >
              {elsewhere.length > 0 ? (
                <ul>
                  {elsewhere.map(([field, message]) => (
                    <li key={field}>
                      <code>{field.replace(/^definition\.?/, '') || 'measure set'}</code>: {message}
                    </li>
                  ))}
                </ul>
              ) : (
                'Each problem is shown next to its field.'
              )}
            </Callout>
          ) : null}
          {save.error && fieldProblems(save.error).size === 0 ? (
            <ProblemCallout error={save.error} />
          ) : null}
          {children(ctx)}
        </DialogBody>
        <DialogFooter
          actions={
            <>
              <Button onClick={onClose}>Cancel</Button>
              <Button
                type="submit"
                intent={Intent.PRIMARY}
                icon="floppy-disk"
                loading={save.isPending}
              >
                Save to the draft
              </Button>
            </>
          }
        />
      </form>
    </Dialog>
  );
}
