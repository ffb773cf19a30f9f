import {
  Button,
  Classes,
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
import type { MeasureSetRef, NextQuarter } from '../../../lib/api/types';
import { fieldProblems } from '../../../lib/field-problems';
import {
  formatRegionDate,
  formatRegionMonth,
  fromRegionDate,
  toRegionDate,
} from '../../../lib/region-dates';
import { useChangeQuarter } from '../api/quarters';

interface Props {
  next: NextQuarter;
  measureSets: MeasureSetRef[];
  onClose: () => void;
}

/** Opens the next audit quarter: its deadline and measure-set version. */
export function OpenQuarterDialog({ next, measureSets, onClose }: Props) {
  const change = useChangeQuarter();
  const [deadline, setDeadline] = useState(toRegionDate(next.defaultDeadline));
  const [measureSetId, setMeasureSetId] = useState(
    next.defaultMeasureSetId ?? measureSets[0]?.id ?? '',
  );
  const [localError, setLocalError] = useState<string | undefined>();
  const problems = fieldProblems(change.error);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const parsed = fromRegionDate(deadline, toRegionDate(next.defaultDeadline));
    if (!parsed.ok) {
      setLocalError(parsed.message);
      return;
    }
    setLocalError(undefined);
    change.mutate(
      {
        kind: 'open',
        body: {
          year: next.year,
          quarter: next.quarter,
          submissionDeadline: parsed.iso,
          measureSetId,
        },
      },
      { onSuccess: onClose },
    );
  };

  const known = new Set(['submissionDeadline', 'measureSetId']);
  const other =
    [...problems.keys()].some((f) => !known.has(f)) || (change.error && problems.size === 0);

  return (
    <Dialog isOpen onClose={onClose} title={`Open ${next.label}`} icon="calendar">
      <form onSubmit={submit} noValidate>
        <DialogBody>
          <p>
            Practices send their extracts for <strong>{next.label}</strong>: the review window runs
            from {formatRegionMonth(next.windowStart)} to {formatRegionMonth(next.windowEnd)}, and
            the quarter ends on {formatRegionDate(next.quarterEnd)}.
          </p>
          <DateField
            id="open-quarter-deadline"
            label="Submission deadline"
            value={deadline}
            onChange={setDeadline}
            error={localError ?? problems.get('submissionDeadline')}
            hint="After the quarter ends. Practices can upload until then; you can move it later."
          />
          <FormGroup
            label="Measure set"
            labelFor="open-quarter-measure-set"
            intent={problems.get('measureSetId') ? Intent.DANGER : Intent.NONE}
            helperText={
              problems.get('measureSetId') ??
              'The published version whose care processes and treatment targets the quarter is measured by.'
            }
          >
            <HTMLSelect
              id="open-quarter-measure-set"
              value={measureSetId}
              onChange={(e) => setMeasureSetId(e.currentTarget.value)}
              fill
            >
              {measureSets.map((m) => (
                <option key={m.id} value={m.id}>
                  {m.label} ({m.id})
                </option>
              ))}
            </HTMLSelect>
          </FormGroup>
          {other ? <ProblemCallout error={change.error} /> : null}
          <p className={Classes.TEXT_MUTED}>Opening the quarter is recorded in the audit trail.</p>
        </DialogBody>
        <DialogFooter
          actions={
            <>
              <Button onClick={onClose}>Cancel</Button>
              <Button
                type="submit"
                intent={Intent.PRIMARY}
                icon="unlock"
                loading={change.isPending}
              >
                Open {next.label}
              </Button>
            </>
          }
        />
      </form>
    </Dialog>
  );
}
