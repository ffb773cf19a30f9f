import {
  Button,
  Dialog,
  DialogBody,
  DialogFooter,
  FormGroup,
  InputGroup,
  Intent,
} from '@blueprintjs/core';
import { type FormEvent, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { MeasureSet } from '../../../lib/api/types';
import { fieldProblems } from '../../../lib/field-problems';
import { useStartDraft } from '../api/measure-sets';

/** Starts a draft from a published version: its new id and label. */
export function StartDraftDialog({ from, onClose }: { from: MeasureSet; onClose: () => void }) {
  const start = useStartDraft(from.id);
  const navigate = useNavigate();
  const [id, setId] = useState(from.suggestedDraftId ?? '');
  const [label, setLabel] = useState(from.suggestedDraftLabel ?? from.label);
  const problems = fieldProblems(start.error);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    start.mutate(
      { id: id.trim(), label: label.trim() },
      { onSuccess: (draft) => navigate(`/measure-sets/${encodeURIComponent(draft.id)}`) },
    );
  };

  const field = (
    name: string,
    text: string,
    hint: string,
    value: string,
    set: (v: string) => void,
  ) => (
    <FormGroup
      label={text}
      labelFor={`new-draft-${name}`}
      intent={problems.get(name) ? Intent.DANGER : Intent.NONE}
      helperText={<span id={`new-draft-${name}-help`}>{problems.get(name) ?? hint}</span>}
    >
      <InputGroup
        id={`new-draft-${name}`}
        value={value}
        onValueChange={set}
        intent={problems.get(name) ? Intent.DANGER : Intent.NONE}
        aria-invalid={problems.has(name) || undefined}
        aria-describedby={`new-draft-${name}-help`}
      />
    </FormGroup>
  );

  return (
    <Dialog isOpen onClose={onClose} title={`Start a draft from ${from.id}`} icon="duplicate">
      <form onSubmit={submit} noValidate>
        <DialogBody>
          <p>
            The draft starts as a copy of <strong>{from.label}</strong>. Nothing uses it until you
            publish it; {from.id} itself never changes.
          </p>
          {field(
            'id',
            'Version id',
            'A name and a year.number version, such as cairn-default-2026.2. It cannot change later.',
            id,
            setId,
          )}
          {field('label', 'Label', 'How people will see the version named.', label, setLabel)}
          {start.error && problems.size === 0 ? <ProblemCallout error={start.error} /> : null}
        </DialogBody>
        <DialogFooter
          actions={
            <>
              <Button onClick={onClose}>Cancel</Button>
              <Button
                type="submit"
                intent={Intent.PRIMARY}
                icon="duplicate"
                loading={start.isPending}
              >
                Start the draft
              </Button>
            </>
          }
        />
      </form>
    </Dialog>
  );
}
