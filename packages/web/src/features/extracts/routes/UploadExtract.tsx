import {
  AnchorButton,
  Button,
  Card,
  Dialog,
  DialogBody,
  FormGroup,
  H1,
  HTMLSelect,
  HTMLTable,
  Intent,
  Radio,
  RadioGroup,
  Spinner,
} from '@blueprintjs/core';
import { type FormEvent, useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type { DateConvention, ExtractFormat, Quarter } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useMe } from '../../../lib/session';
import { TEMPLATE_CSV, TEMPLATE_XLSX, useExtractFormat, useHistory } from '../api/extracts';
import { uploadProblemOf, useUploadExtract } from '../api/mutations';
import { practiceLabel, usePracticeChoices } from '../api/practices';
import { DropZone } from '../components/DropZone';
import { formatBytes, formatDate, formatMonth } from '../components/format';
import { StatusTag } from '../components/StatusTag';
import './Extracts.css';

/** `/extracts/upload`: a practice lead (or regional lead) sends a practice's extract for an audit quarter. */
export function UploadExtract() {
  usePageTitle('Upload extract');
  return (
    <RequireRole roles={['practice_lead', 'regional_lead']}>
      <UploadScreen />
    </RequireRole>
  );
}

function limitsHint(format: ExtractFormat | undefined): string {
  if (!format) return 'An .xlsx workbook or a .csv file saved as UTF-8.';
  return `An .xlsx workbook or a .csv file saved as UTF-8; at most ${formatBytes(format.limits.maxBytes)} and ${formatCount(format.limits.maxRows)} rows.`;
}

function UploadScreen() {
  const me = useMe();
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const choices = usePracticeChoices();
  const format = useExtractFormat();
  const upload = useUploadExtract();
  const [file, setFile] = useState<File | null>(null);
  const [convention, setConvention] = useState<DateConvention | ''>('');
  const [showColumns, setShowColumns] = useState(false);

  const regional = me.data?.role === 'regional_lead';
  const practices = choices.practices;
  const askedPractice = Number(params.get('practice'));
  const practice =
    practices.find((p) => p.id === askedPractice) ??
    (practices.length === 1 ? practices[0] : null) ??
    null;
  // The quarters the API allows an upload to: for the chosen practice, or for any of them.
  const allowed = new Set(
    (practice ? [practice] : practices).flatMap((p) => choices.uploadQuarterIds(p.id)),
  );
  const selectable = choices.quarters.filter((q) => allowed.has(q.id));
  const open = selectable.filter((q) => q.status === 'open');
  const closed = selectable.filter((q) => q.status === 'closed');
  const askedQuarter = Number(params.get('quarter'));
  const quarter: Quarter | null = selectable.find((q) => q.id === askedQuarter) ?? open[0] ?? null;
  const history = useHistory(practice?.id ?? null);
  const here = history.data?.quarters.find((q) => q.quarter.id === quarter?.id);
  const currentHere = here?.submissions.find((s) => s.id === here.currentSubmissionId) ?? null;
  const waitingHere = here?.submissions.filter(
    (s) => s.status === 'awaiting_confirmation' || s.status === 'processing',
  );

  const maxBytes = format.data?.limits.maxBytes;
  const tooLarge = file !== null && maxBytes !== undefined && file.size > maxBytes;
  const ready = practice !== null && quarter !== null && file !== null && !tooLarge;
  // Said beside the disabled button, so that nobody wonders why it cannot be pressed.
  const missing = [
    practice === null ? 'the practice' : null,
    quarter === null ? 'the audit quarter' : null,
    file === null ? 'the extract file' : null,
  ].filter((m): m is string => m !== null);
  const stillToChoose =
    missing.length === 0 || tooLarge
      ? null
      : `To upload, choose ${missing.length === 1 ? missing[0] : `${missing.slice(0, -1).join(', ')} and ${missing[missing.length - 1]}`}.`;

  const choose = (key: 'practice' | 'quarter', value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
    upload.reset();
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!ready) return;
    upload.mutate(
      {
        practiceId: practice.id,
        quarterId: quarter.id,
        file,
        dateConvention: convention || null,
      },
      {
        onSuccess: (submission) =>
          void navigate(`/practices/${practice.id}/submissions/${submission.id}`),
      },
    );
  };

  const problem = uploadProblemOf(upload.error);

  return (
    <div className="cairn-extracts cairn-upload">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Upload extract</H1>
          <p className="cairn-muted">
            {regional
              ? "Send a practice's de-identified annual-review extract for an audit quarter, on the practice's behalf."
              : "Send your practice's de-identified annual-review extract for an audit quarter."}{' '}
            Cairn checks every row and shows you what it accepted, what it refused and why, before
            anything is used.
          </p>
        </div>
      </div>

      <div className="cairn-upload-layout">
        <form className="cairn-upload-form" onSubmit={submit} aria-label="Upload an extract">
          <Card>
            <FormGroup
              label="Practice"
              labelFor="cairn-upload-practice"
              helperText={
                regional ? 'As regional lead you may send an extract for any practice.' : undefined
              }
            >
              {choices.isPending ? (
                <Spinner size={20} aria-label="Loading practices" />
              ) : practices.length === 0 ? (
                <Notice intent={Intent.WARNING} icon="info-sign" compact>
                  You are not assigned to a practice yet. Ask your regional lead to add your
                  practice to your account.
                </Notice>
              ) : practices.length === 1 && !regional ? (
                <p className="cairn-fixed-choice" id="cairn-upload-practice">
                  {practiceLabel(practices[0]!)}
                </p>
              ) : regional ? (
                <HTMLSelect
                  id="cairn-upload-practice"
                  fill
                  value={practice ? String(practice.id) : ''}
                  onChange={(e) => choose('practice', e.currentTarget.value)}
                >
                  <option value="">Choose a practice…</option>
                  {practices.map((p) => (
                    <option key={p.id} value={p.id}>
                      {practiceLabel(p, true)}
                    </option>
                  ))}
                </HTMLSelect>
              ) : (
                <RadioGroup
                  name="practice"
                  selectedValue={practice ? String(practice.id) : ''}
                  onChange={(e) => choose('practice', e.currentTarget.value)}
                  aria-label="Practice"
                >
                  {practices.map((p) => (
                    <Radio key={p.id} value={String(p.id)} label={practiceLabel(p)} />
                  ))}
                </RadioGroup>
              )}
            </FormGroup>
            <ProblemCallout error={choices.error} />

            <FormGroup
              label="Audit quarter"
              labelFor="cairn-upload-quarter"
              helperText={
                quarter
                  ? `Review window ${formatMonth(quarter.windowStart)} to ${formatMonth(quarter.windowEnd)}; send by ${formatDate(quarter.submissionDeadline)}.`
                  : undefined
              }
            >
              {choices.isPending ? (
                <Spinner size={20} aria-label="Loading audit quarters" />
              ) : selectable.length === 0 ? (
                <Notice intent={Intent.WARNING} icon="time" compact>
                  No audit quarter is open for extracts. Your regional lead opens each quarter.
                </Notice>
              ) : (
                <HTMLSelect
                  id="cairn-upload-quarter"
                  fill
                  value={quarter ? String(quarter.id) : ''}
                  onChange={(e) => choose('quarter', e.currentTarget.value)}
                >
                  <optgroup label="Open">
                    {open.map((q) => (
                      <option key={q.id} value={q.id}>
                        {q.label} (deadline {formatDate(q.submissionDeadline)})
                      </option>
                    ))}
                  </optgroup>
                  {closed.length > 0 ? (
                    <optgroup label="Closed to practices (late corrections)">
                      {closed.map((q) => (
                        <option key={q.id} value={q.id}>
                          {q.label} (closed)
                        </option>
                      ))}
                    </optgroup>
                  ) : null}
                </HTMLSelect>
              )}
            </FormGroup>

            {practice && quarter && here ? (
              <div className="cairn-upload-context" aria-live="polite">
                {currentHere ? (
                  <p>
                    Current submission for {quarter.label}:{' '}
                    <Link to={`/practices/${practice.id}/submissions/${currentHere.id}`}>
                      submission {currentHere.id}
                    </Link>{' '}
                    ({formatCount(currentHere.counts?.rowsAccepted ?? 0)} records, uploaded{' '}
                    {formatDateTime(currentHere.uploadedAt)}). A new extract replaces it only when
                    you confirm the new one.
                  </p>
                ) : (
                  <p>
                    {practice.name} has no current submission for {quarter.label} yet.
                  </p>
                )}
                {(waitingHere ?? []).map((w) => (
                  <p key={w.id}>
                    <StatusTag status={w.status} />{' '}
                    <Link to={`/practices/${practice.id}/submissions/${w.id}`}>
                      Submission {w.id}
                    </Link>{' '}
                    ({w.file.name}, uploaded {formatDateTime(w.uploadedAt)})
                  </p>
                ))}
              </div>
            ) : null}

            <FormGroup label="Extract file" labelInfo="(required)">
              <DropZone
                file={file}
                onFile={(next) => {
                  setFile(next);
                  upload.reset();
                }}
                disabled={upload.isPending}
                hint={limitsHint(format.data)}
              />
            </FormGroup>
            {tooLarge && maxBytes !== undefined ? (
              <Notice
                intent={Intent.DANGER}
                icon="error"
                title="This file is too large"
                className="cairn-problem"
              >
                It is {formatBytes(file.size)}; Cairn accepts at most {formatBytes(maxBytes)} for
                one extract. Check that it holds only the extract (one sheet, no pictures), or save
                it as CSV UTF-8, which is much smaller.
              </Notice>
            ) : null}

            <FormGroup
              label="Dates written as text"
              labelInfo="(optional)"
              helperText="Only needed when the file has dates such as 04/05/2026 that could be read two ways. Spreadsheet dates and dates written 2026-05-04 are always clear."
            >
              <RadioGroup
                name="dateConvention"
                selectedValue={convention}
                onChange={(e) => setConvention(e.currentTarget.value as DateConvention | '')}
                aria-label="Dates written as text"
              >
                <Radio
                  value=""
                  label="Not needed (dates that read two ways are then refused row by row)"
                />
                <Radio value="day_first" label="Day first: 04/05/2026 is 4 May 2026" />
                <Radio value="month_first" label="Month first: 04/05/2026 is 5 April 2026" />
              </RadioGroup>
            </FormGroup>

            {problem?.code === 'identical_extract' ? (
              <Notice
                intent={Intent.WARNING}
                icon="duplicate"
                title="This file was already uploaded"
                className="cairn-problem"
                role="alert"
              >
                <p>{problem.detail}</p>
                {problem.submissionId && practice ? (
                  <Link to={`/practices/${practice.id}/submissions/${problem.submissionId}`}>
                    Open submission {problem.submissionId}
                  </Link>
                ) : null}
              </Notice>
            ) : problem?.code === 'file_too_large' ? (
              <Notice
                intent={Intent.DANGER}
                icon="ban-circle"
                title="The file is too large"
                className="cairn-problem"
                role="alert"
              >
                <p>{problem.detail}</p>
                {problem.fix ? (
                  <p>
                    <strong>How to fix it:</strong> {problem.fix}
                  </p>
                ) : null}
                {problem.submissionId && practice ? (
                  <Link to={`/practices/${practice.id}/submissions/${problem.submissionId}`}>
                    See submission {problem.submissionId} in the history
                  </Link>
                ) : null}
              </Notice>
            ) : (
              <ProblemCallout error={upload.error} />
            )}

            <div className="cairn-button-row">
              <Button
                type="submit"
                intent={Intent.PRIMARY}
                icon="upload"
                size="large"
                disabled={!ready}
                loading={upload.isPending}
                aria-describedby={stillToChoose ? 'cairn-upload-still-to-choose' : undefined}
              >
                Upload and check
              </Button>
              {upload.isPending ? <span className="cairn-muted">Sending the file…</span> : null}
              {stillToChoose && !upload.isPending ? (
                <span className="cairn-muted" id="cairn-upload-still-to-choose">
                  {stillToChoose}
                </span>
              ) : null}
            </div>
          </Card>
        </form>

        <aside className="cairn-upload-aside" aria-label="Extract template">
          <Card>
            <h2 className="bp6-heading cairn-aside-heading">Start from Cairn&apos;s template</h2>
            <p>
              The XLSX template has drop-down lists for coded values, a data dictionary and
              instructions. The CSV template has the headings only.
            </p>
            <div className="cairn-template-buttons">
              <AnchorButton href={TEMPLATE_XLSX} download icon="th" intent={Intent.PRIMARY}>
                Download template (XLSX)
              </AnchorButton>
              <AnchorButton href={TEMPLATE_CSV} download icon="document">
                Download template (CSV)
              </AnchorButton>
            </div>
            {format.data ? (
              <>
                <p className="cairn-muted">
                  One row per person with diabetes; no names, national patient numbers, addresses or
                  full dates of birth. Up to {formatBytes(format.data.limits.maxBytes)} and{' '}
                  {formatCount(format.data.limits.maxRows)} rows.
                </p>
                <Button
                  variant="outlined"
                  icon="th-list"
                  aria-haspopup="dialog"
                  onClick={() => setShowColumns(true)}
                >
                  See the {format.data.columns.length} columns Cairn reads
                </Button>
                <FormatColumnsDialog
                  columns={format.data.columns}
                  isOpen={showColumns}
                  onClose={() => setShowColumns(false)}
                />
              </>
            ) : null}
          </Card>
        </aside>
      </div>
    </div>
  );
}

/** The extract's columns, in a dialog wide enough to read them (not squeezed into the side panel). */
function FormatColumnsDialog({
  columns,
  isOpen,
  onClose,
}: {
  columns: ExtractFormat['columns'];
  isOpen: boolean;
  onClose: () => void;
}) {
  return (
    <Dialog
      isOpen={isOpen}
      onClose={onClose}
      className="cairn-format-dialog"
      aria-labelledby="cairn-format-dialog-title"
    >
      <div className="cairn-dialog-head">
        <h2 id="cairn-format-dialog-title" className="bp6-heading">
          The {columns.length} columns Cairn reads
        </h2>
        <Button variant="minimal" icon="cross" aria-label="Close" onClick={onClose} />
      </div>
      <DialogBody>
        <p>
          One row per person with diabetes, under these headings (the template has them all, with a
          data dictionary). Columns marked as needed must be present; a cell may be blank where
          nothing was recorded unless its value is needed too.
        </p>
        <HTMLTable compact striped className="cairn-format-table">
          <thead>
            <tr>
              <th scope="col">Heading</th>
              <th scope="col">Needed</th>
              <th scope="col">What it holds</th>
              <th scope="col">Values</th>
            </tr>
          </thead>
          <tbody>
            {columns.map((c) => (
              <tr key={c.key}>
                <td>
                  <code>{c.key}</code>
                </td>
                <td>{c.required}</td>
                <td>{c.meaning}</td>
                <td>{c.allowed}</td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      </DialogBody>
    </Dialog>
  );
}
