import {
  Button,
  Callout,
  Dialog,
  DialogBody,
  DialogFooter,
  FormGroup,
  HTMLSelect,
  Intent,
} from '@blueprintjs/core';
import { type FormEvent, useState } from 'react';
import { DateField } from '../../../components/DateField';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { AuditQuarter, MeasureSetRef, QuarterChanges } from '../../../lib/api/types';
import { fieldProblems } from '../../../lib/field-problems';
import { fromRegionDate, toRegionDate } from '../../../lib/region-dates';
import { useChangeQuarter } from '../api/quarters';

interface Props {
  row: AuditQuarter;
  measureSets: MeasureSetRef[];
  /** Reopen: the dialog reopens a closed quarter (with this deadline) instead of changing it. */
  reopen?: boolean;
  onClose: () => void;
}

/**
 * Changes a quarter: its deadline, and its measure set while the API allows
 * it (open, no report published yet); or reopens a closed one, with a
 * deadline.
 */
export function ChangeQuarterDialog({ row, measureSets, reopen = false, onClose }: Props) {
  const { quarter, actions } = row;
  const change = useChangeQuarter();
  const [deadline, setDeadline] = useState(toRegionDate(quarter.submissionDeadline));
  const [measureSetId, setMeasureSetId] = useState(quarter.measureSetId);
  const [localError, setLocalError] = useState<string | undefined>();
  const problems = fieldProblems(change.error);
  const choices = measureSets.some((m) => m.id === quarter.measureSetId)
    ? measureSets
    : [row.measureSet, ...measureSets];

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = fromRegionDate(deadline, toRegionDate(quarter.submissionDeadline));
    if (!parsed.ok) {
      setLocalError(parsed.message);
      return;
    }
    setLocalError(undefined);
    if (reopen) {
      change.mutate(
        { kind: 'reopen', quarterId: quarter.id, body: { submissionDeadline: parsed.iso } },
        { onSuccess: onClose },
      );
      return;
    }
    const body: QuarterChanges = {};
    if (parsed.iso !== quarter.submissionDeadline) body.submissionDeadline = parsed.iso;
    if (measureSetId !== quarter.measureSetId) body.measureSetId = measureSetId;
    if (Object.keys(body).length === 0) {
      onClose();
      return;
    }
    change.mutate({ kind: 'update', quarterId: quarter.id, body }, { onSuccess: onClose });
  };

  const known = new Set(['submissionDeadline', 'measureSetId']);
  const other =
    [...problems.keys()].some((f) => !known.has(f)) || (change.error && problems.size === 0);

  return (
    <Dialog
      isOpen
      onClose={onClose}
      title={reopen ? `Reopen ${quarter.label}` : `Change ${quarter.label}`}
      icon={reopen ? 'unlock' : 'edit'}
    >
      <form onSubmit={submit} noValidate>
        <DialogBody>
          {reopen ? (
            <p>
              Practice leads can upload and confirm extracts for {quarter.label} again until the
              deadline. Move the deadline if it has passed.
            </p>
          ) : null}
          <DateField
            id="quarter-deadline"
            label="Submission deadline"
            value={deadline}
            onChange={setDeadline}
            error={localError ?? problems.get('submissionDeadline')}
            hint="After the quarter ends."
          />
          {reopen ? null : (
            <FormGroup
              label="Measure set"
              labelFor="quarter-measure-set"
              intent={problems.get('measureSetId') ? Intent.DANGER : Intent.NONE}
              helperText={
                problems.get('measureSetId') ??
                (actions.changeMeasureSet
                  ? 'Results of the quarter are worked out again with the version chosen; the submissions stay as they are.'
                  : undefined)
              }
            >
              <HTMLSelect
                id="quarter-measure-set"
                value={measureSetId}
                onChange={(e) => setMeasureSetId(e.currentTarget.value)}
                disabled={!actions.changeMeasureSet}
                fill
              >
                {choices.map((m) => (
                  <option key={m.id} value={m.id}>
                    {m.label} ({m.id})
                  </option>
                ))}
              </HTMLSelect>
            </FormGroup>
          )}
          {!reopen && !actions.changeMeasureSet ? (
            <Callout intent={Intent.NONE} icon="lock" className="cairn-quarter-note">
              {quarter.status === 'closed'
                ? 'The measure set of a closed quarter stays as it is. Reopen the quarter to change it.'
                : 'A report has been published from this quarter: its measure set stays the one the report was computed with.'}
            </Callout>
          ) : null}
          {other ? <ProblemCallout error={change.error} /> : null}
        </DialogBody>
        <DialogFooter
          actions={
            <>
              <Button onClick={onClose}>Cancel</Button>
              <Button
                type="submit"
                intent={Intent.PRIMARY}
                icon={reopen ? 'unlock' : 'floppy-disk'}
                loading={change.isPending}
              >
                {reopen ? `Reopen ${quarter.label}` : 'Save changes'}
              </Button>
            </>
          }
        />
      </form>
    </Dialog>
  );
}
