import {
  Button,
  Dialog,
  DialogBody,
  DialogFooter,
  FormGroup,
  Intent,
  TextArea,
} from '@blueprintjs/core';
import { type FormEvent, useId, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { fieldProblems } from '../../../lib/field-problems';
import { usePublishQuarter, useQuarterReports } from '../api/publish';

const BLANK_NOTE = 'Write a release note: what readers of this report should know.';

/**
 * The benchmark page's Publish action: shown only when the API allows the
 * reader to publish the chosen quarter (`actions.publish` of its report list);
 * a dialog asks for the release note (a blank one is refused next to the
 * field), publishing freezes the quarter's benchmark as a new report, and the
 * reader goes to the report's permanent page.
 */
export function PublishReport({
  quarterId,
  quarterLabel,
}: {
  quarterId: number | null;
  quarterLabel: string | null;
}) {
  const reports = useQuarterReports(quarterId);
  const [open, setOpen] = useState(false);
  if (quarterId === null || !reports.data?.actions.publish) return null;
  const latest = reports.data.reports.find((r) => r.status === 'published') ?? null;
  return (
    <>
      <Button icon="upload" intent={Intent.PRIMARY} onClick={() => setOpen(true)}>
        Publish report…
      </Button>
      {open ? (
        <PublishDialog
          quarterId={quarterId}
          quarterLabel={quarterLabel ?? 'this quarter'}
          replaces={latest?.label ?? null}
          onClose={() => setOpen(false)}
        />
      ) : null}
    </>
  );
}

function PublishDialog({
  quarterId,
  quarterLabel,
  replaces,
  onClose,
}: {
  quarterId: number;
  quarterLabel: string;
  replaces: string | null;
  onClose: () => void;
}) {
  const publish = usePublishQuarter();
  const navigate = useNavigate();
  const noteId = useId();
  const [note, setNote] = useState('');
  const [blank, setBlank] = useState(false);
  const problems = fieldProblems(publish.error);
  const noteProblem = blank ? BLANK_NOTE : (problems.get('releaseNote') ?? null);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (note.trim().length === 0) {
      setBlank(true);
      return;
    }
    setBlank(false);
    publish.mutate(
      { quarterId, releaseNote: note },
      { onSuccess: (report) => void navigate(report.permalink) },
    );
  };
  return (
    <Dialog isOpen onClose={onClose} title={`Publish ${quarterLabel}`} icon="upload">
      <form onSubmit={submit} noValidate>
        <DialogBody>
          <p>
            Publishing freezes this benchmark of the practices’ current submissions for{' '}
            {quarterLabel} as a report: every practice’s results, the region’s, funnels and trends.
            Its figures never change afterwards; practice leads read their own practice in full and
            other practices under disclosure control.
          </p>
          {replaces ? (
            <p>{replaces} stays readable, marked as replaced by the new report.</p>
          ) : null}
          <ClinicalCaution compact />
          <FormGroup
            label="Release note"
            labelFor={noteId}
            labelInfo="(required)"
            helperText={noteProblem ?? 'What readers of this report should know about it.'}
            intent={noteProblem ? Intent.DANGER : Intent.NONE}
          >
            <TextArea
              id={noteId}
              fill
              rows={3}
              value={note}
              maxLength={2000}
              onChange={(e) => {
                setNote(e.target.value);
                setBlank(false);
              }}
              intent={noteProblem ? Intent.DANGER : Intent.NONE}
              aria-invalid={noteProblem ? true : undefined}
            />
          </FormGroup>
          {publish.error && !problems.has('releaseNote') ? (
            <ProblemCallout error={publish.error} />
          ) : null}
        </DialogBody>
        <DialogFooter
          actions={
            <>
              <Button onClick={onClose}>Cancel</Button>
              <Button type="submit" intent={Intent.PRIMARY} loading={publish.isPending}>
                Publish report
              </Button>
            </>
          }
        />
      </form>
    </Dialog>
  );
}
