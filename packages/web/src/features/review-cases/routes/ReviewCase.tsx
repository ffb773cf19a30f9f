import {
  Button,
  Callout,
  FileInput,
  FormGroup,
  H1,
  HTMLSelect,
  HTMLTable,
  Spinner,
  Tag,
  TextArea,
} from '@blueprintjs/core';
import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import { roleValues, type CaseFinding, type ReviewCase as Case } from '../../../lib/api/types';
import { formatDateTime, formatPercent } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { roleLabels } from '../../../lib/roles';
import { useAnswer, useCase, useCases, useComment, useTransition } from '../api/review-cases';
import { StatusTag } from '../components/StatusTag';
import '../review.css';

/** `/review-cases/:caseId`: the frozen figures, the timeline, and what the reader may do now. */
export function ReviewCase() {
  usePageTitle('Review case');
  return (
    <RequireRole roles={roleValues}>
      <ReviewCaseScreen />
    </RequireRole>
  );
}

const KIND_WORDS: Record<string, string> = {
  opened: 'opened the case',
  question: 'asked',
  answer: 'answered',
  note: 'wrote an internal note',
  state: 'changed the state',
};

function ReviewCaseScreen() {
  const id = Number(useParams().caseId);
  const c = useCase(id);
  usePageTitle(c.data ? `Review case ${c.data.id}` : 'Review case');
  if (c.isPending) return <Spinner aria-label="Loading the review case" />;
  if (!c.data) return <ProblemCallout error={c.error} />;
  const d = c.data;
  const e = d.evidence;
  return (
    <div className="cairn-review">
      <p>
        <Link to="/review-cases">← Review cases</Link>
      </p>
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">
            Review case {d.id}: {d.practice.code} {d.practice.name}
          </H1>
          <p className="cairn-muted">
            {d.measure.label} · {d.quarter.label} · guideline: {d.measure.source}
          </p>
        </div>
        <div>
          <StatusTag status={d.status} label={d.statusLabel} />{' '}
          {d.findingLabel ? <Tag intent="primary">{d.findingLabel}</Tag> : null}
        </div>
      </div>
      {d.reopened ? <ReopenedNotice c={d} /> : null}
      <ClinicalCaution compact />
      <section className="cairn-review-section">
        <h2>The figures that prompted it (as they were on {formatDateTime(d.openedAt)})</h2>
        <p>{e.reason}</p>
        <HTMLTable compact className="cairn-review-facts">
          <tbody>
            <tr>
              <th scope="row">Practice</th>
              <td>
                {formatPercent(e.rate)} ({e.events} of {e.n}; 95 % interval{' '}
                {formatPercent(e.intervalLower)}–{formatPercent(e.intervalUpper)})
              </td>
            </tr>
            <tr>
              <th scope="row">Region</th>
              <td>{formatPercent(e.theta0)}</td>
            </tr>
            <tr>
              <th scope="row">99.8 % limits at this n</th>
              <td>
                {formatPercent(e.outerLower)}–{formatPercent(e.outerUpper)}
              </td>
            </tr>
            <tr>
              <th scope="row">Read from</th>
              <td>
                {e.origin === 'report' ? 'published report' : 'draft benchmark'} {e.resultId}, built{' '}
                {formatDateTime(e.builtAt)}
              </td>
            </tr>
          </tbody>
        </HTMLTable>
      </section>
      <Timeline c={d} />
      <Actions c={d} />
    </div>
  );
}

/** A reopened case says so, with the close it undid: the finding stays readable. */
function ReopenedNotice({ c }: { c: Case }) {
  const r = c.reopened!;
  return (
    <Notice intent="warning" icon="undo" title="Reopened" className="cairn-review-reopened">
      <p>
        {r.by} reopened this case on <time dateTime={r.at}>{formatDateTime(r.at)}</time>.{' '}
        {r.previousFindingLabel ? (
          <>
            It had been closed
            {r.previousClosedAt ? (
              <>
                {' '}
                on <time dateTime={r.previousClosedAt}>{formatDateTime(r.previousClosedAt)}</time>
              </>
            ) : null}{' '}
            with the finding <strong>“{r.previousFindingLabel}”</strong>
            {c.status === 'closed' ? '; it has been closed again since.' : '.'}
          </>
        ) : null}
      </p>
    </Notice>
  );
}

function Timeline({ c }: { c: Case }) {
  return (
    <section className="cairn-review-section">
      <h2>Timeline</h2>
      {c.timeline.length === 0 ? (
        <p className="cairn-muted">Nothing has been sent to the practice yet.</p>
      ) : (
        <ol className="cairn-timeline">
          {c.timeline.map((t) => (
            <li key={t.id} className={`cairn-timeline-${t.visibility}`}>
              <div className="cairn-timeline-head">
                <strong>{t.authorName}</strong>{' '}
                <span className="cairn-muted">
                  ({roleLabels[t.authorRole as keyof typeof roleLabels] ?? t.authorRole})
                </span>{' '}
                {KIND_WORDS[t.kind]}
                {t.toStatus && t.kind === 'state' ? ` to “${t.toStatus.replace('_', ' ')}”` : ''}
                {t.finding ? ` with the finding “${t.finding.replace(/_/g, ' ')}”` : ''} ·{' '}
                <time dateTime={t.at}>{formatDateTime(t.at)}</time>{' '}
                {t.visibility === 'internal' ? (
                  <Tag minimal icon="eye-off">
                    internal: the practice does not see this
                  </Tag>
                ) : null}
              </div>
              {t.body ? <p className="cairn-timeline-body">{t.body}</p> : null}
              {t.files.length > 0 ? (
                <ul>
                  {t.files.map((f) => (
                    <li key={f.id}>
                      <a href={f.path}>{f.fileName}</a>{' '}
                      <span className="cairn-muted">
                        ({f.mediaType}, {Math.ceil(f.sizeBytes / 1024)} kB)
                      </span>
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

function Actions({ c }: { c: Case }) {
  const a = c.actions;
  const closed = c.status === 'closed' ? <p className="cairn-muted">This case is closed.</p> : null;
  if (!Object.values(a).some(Boolean))
    return closed ?? <p className="cairn-muted">There is nothing for you to do here.</p>;
  return (
    <section className="cairn-review-section">
      {closed}
      <h2>Next step</h2>
      {a.answer ? <AnswerForm c={c} /> : null}
      {a.ask ? <AskForm c={c} /> : null}
      {a.close ? <CloseForm c={c} /> : null}
      {a.reopen ? <ReopenForm c={c} /> : null}
      {a.note || a.comment ? <CommentForm c={c} /> : null}
    </section>
  );
}

function AskForm({ c }: { c: Case }) {
  const [text, setText] = useState('');
  const t = useTransition(c.id);
  return (
    <form
      className="cairn-review-form"
      onSubmit={(e) => {
        e.preventDefault();
        t.mutate(
          { action: 'ask', expectedVersion: c.version, message: text },
          { onSuccess: () => setText('') },
        );
      }}
    >
      <FormGroup
        label="Question to the practice"
        labelFor="ask-text"
        helperText="The practice’s leads are told by e-mail and answer here."
      >
        <TextArea
          id="ask-text"
          fill
          value={text}
          onChange={(e) => setText(e.currentTarget.value)}
        />
      </FormGroup>
      <ProblemCallout error={t.error} />
      <Button type="submit" intent="primary" loading={t.isPending}>
        Send the question
      </Button>
    </form>
  );
}

function CloseForm({ c }: { c: Case }) {
  const findings = useCases().data?.findings ?? [];
  const [finding, setFinding] = useState<CaseFinding | ''>('');
  const [text, setText] = useState('');
  const t = useTransition(c.id);
  return (
    <form
      className="cairn-review-form"
      onSubmit={(e) => {
        e.preventDefault();
        if (finding)
          t.mutate({ action: 'close', expectedVersion: c.version, message: text, finding });
      }}
    >
      <FormGroup label="Finding" labelFor="close-finding">
        <HTMLSelect
          id="close-finding"
          value={finding}
          onChange={(e) => setFinding(e.currentTarget.value as CaseFinding)}
          options={[
            { value: '', label: 'Choose a finding' },
            ...findings.map((f) => ({ value: f.key, label: f.label })),
          ]}
        />
      </FormGroup>
      <FormGroup label="Closing remark (the practice sees it)" labelFor="close-text">
        <TextArea
          id="close-text"
          fill
          value={text}
          onChange={(e) => setText(e.currentTarget.value)}
        />
      </FormGroup>
      <ProblemCallout error={t.error} />
      <Button type="submit" icon="tick" disabled={!finding} loading={t.isPending}>
        Close the case
      </Button>
    </form>
  );
}

function ReopenForm({ c }: { c: Case }) {
  const [text, setText] = useState('');
  const t = useTransition(c.id);
  return (
    <form
      className="cairn-review-form"
      onSubmit={(e) => {
        e.preventDefault();
        t.mutate({ action: 'reopen', expectedVersion: c.version, message: text });
      }}
    >
      <FormGroup label="Why reopen (the practice sees it)" labelFor="reopen-text">
        <TextArea
          id="reopen-text"
          fill
          value={text}
          onChange={(e) => setText(e.currentTarget.value)}
        />
      </FormGroup>
      <ProblemCallout error={t.error} />
      <Button type="submit" icon="undo" loading={t.isPending}>
        Reopen
      </Button>
    </form>
  );
}

function CommentForm({ c }: { c: Case }) {
  const [text, setText] = useState('');
  const internalAllowed = c.actions.note;
  const [internal, setInternal] = useState(internalAllowed);
  const m = useComment(c.id);
  return (
    <form
      className="cairn-review-form"
      onSubmit={(e) => {
        e.preventDefault();
        m.mutate(
          { body: text, visibility: internal && internalAllowed ? 'internal' : 'practice' },
          { onSuccess: () => setText('') },
        );
      }}
    >
      <FormGroup
        label={internalAllowed ? 'Note or comment' : 'Comment'}
        labelFor="comment-text"
        helperText="Comments are kept as written: they cannot be edited or removed."
      >
        <TextArea
          id="comment-text"
          fill
          value={text}
          onChange={(e) => setText(e.currentTarget.value)}
        />
      </FormGroup>
      {internalAllowed && c.actions.comment ? (
        <FormGroup label="Who sees it" labelFor="comment-visibility">
          <HTMLSelect
            id="comment-visibility"
            value={internal ? 'internal' : 'practice'}
            onChange={(e) => setInternal(e.currentTarget.value === 'internal')}
            options={[
              { value: 'internal', label: 'Internal note: the audit team only' },
              { value: 'practice', label: 'Comment: the practice sees it' },
            ]}
          />
        </FormGroup>
      ) : null}
      <ProblemCallout error={m.error} />
      <Button type="submit" loading={m.isPending}>
        Add
      </Button>
    </form>
  );
}

/** What an answer may carry; the API judges every file again by its bytes. */
const ANSWER_EXTENSIONS = ['pdf', 'xlsx', 'csv', 'png', 'jpg', 'jpeg'];
const ANSWER_MAX_BYTES = 10 * 1024 * 1024;
const ANSWER_MAX_FILES = 5;

/** Why an answer cannot be sent as it is, in words; empty when it can. */
export function answerProblems(text: string, files: readonly File[]): string[] {
  const out: string[] = [];
  if (text.trim() === '') out.push('Write your answer before sending it.');
  if (files.length > ANSWER_MAX_FILES)
    out.push(
      `At most ${ANSWER_MAX_FILES} files can go with one answer; ${files.length} are chosen.`,
    );
  for (const f of files) {
    const dot = f.name.lastIndexOf('.');
    const ext = dot < 0 ? '' : f.name.slice(dot + 1).toLowerCase();
    if (!ANSWER_EXTENSIONS.includes(ext))
      out.push(`“${f.name}” is not a PDF, XLSX, CSV, PNG or JPEG file.`);
    else if (f.size > ANSWER_MAX_BYTES)
      out.push(
        `“${f.name}” is ${(f.size / 1024 / 1024).toFixed(1)} MB; each file may be at most 10 MB.`,
      );
  }
  return out;
}

function AnswerForm({ c }: { c: Case }) {
  const [text, setText] = useState('');
  const [files, setFiles] = useState<File[]>([]);
  const [problems, setProblems] = useState<string[]>([]);
  const m = useAnswer(c.id);
  return (
    <form
      className="cairn-review-form"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const found = answerProblems(text, files);
        setProblems(found);
        if (found.length > 0) return;
        m.mutate(
          { text, expectedVersion: c.version, files },
          {
            onSuccess: () => {
              setText('');
              setFiles([]);
            },
          },
        );
      }}
    >
      <FormGroup label="Your answer" labelFor="answer-text">
        <TextArea
          id="answer-text"
          fill
          value={text}
          onChange={(e) => setText(e.currentTarget.value)}
        />
      </FormGroup>
      <FormGroup
        label="Attachments (optional)"
        labelFor="answer-files"
        helperText="PDF, XLSX, CSV, PNG or JPEG; up to 5 files of 10 MB each. Never attach patient-identifiable data."
      >
        <FileInput
          fill
          text={files.length === 0 ? 'Choose files…' : files.map((f) => f.name).join(', ')}
          inputProps={{
            id: 'answer-files',
            multiple: true,
            accept: '.pdf,.xlsx,.csv,.png,.jpg,.jpeg',
          }}
          onInputChange={(e) => setFiles(Array.from(e.currentTarget.files ?? []))}
        />
      </FormGroup>
      {problems.length > 0 ? (
        <Notice intent="danger" icon="error" title="The answer was not sent">
          <ul>
            {problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </Notice>
      ) : null}
      <ProblemCallout error={m.error} />
      {m.isSuccess ? <Callout intent="success">Your answer was sent.</Callout> : null}
      <Button type="submit" intent="primary" loading={m.isPending}>
        Send the answer
      </Button>
    </form>
  );
}
