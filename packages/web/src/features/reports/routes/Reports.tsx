import {
  Button,
  Card,
  FormGroup,
  H1,
  H2,
  HTMLSelect,
  HTMLTable,
  Intent,
  Spinner,
  TextArea,
} from '@blueprintjs/core';
import { type FormEvent, useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { Report } from '../../../lib/api/types';
import { fieldProblems } from '../../../lib/field-problems';
import { formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { usePublishReport, useReportList } from '../api/reports';
import { ReportStatusTag } from './ReportStatusTag';
import { useQuarterList } from '../../../lib/quarter-list';
import './Reports.css';

/**
 * `/reports?quarter=ID`: the region's published reports, newest first, and
 * for the regional lead a form that publishes the chosen quarter's benchmark
 * as a new report (the API says who may: `actions.publish`).
 */
export function Reports() {
  usePageTitle('Reports');
  const [params, setParams] = useSearchParams();
  const quarters = useQuarterList();
  const chosen = params.get('quarter');
  const quarterId = chosen ? Number(chosen) : null;
  const list = useReportList(quarterId);

  return (
    <div className="cairn-reports">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Reports</H1>
          <p className="cairn-muted">
            A report is a quarter’s benchmark frozen when it was published: its figures never change
            afterwards, whatever extracts are confirmed later.
          </p>
        </div>
      </div>
      <FormGroup label="Audit quarter" labelFor="report-quarter" inline>
        <HTMLSelect
          id="report-quarter"
          value={chosen ?? ''}
          onChange={(e) => setParams(e.target.value ? { quarter: e.target.value } : {})}
        >
          <option value="">Every quarter</option>
          {(quarters.data ?? []).map((q) => (
            <option key={q.id} value={q.id}>
              {q.label} ({q.status})
            </option>
          ))}
        </HTMLSelect>
      </FormGroup>
      <ProblemCallout error={list.error ?? quarters.error} />
      {list.isPending ? <Spinner aria-label="Loading reports" /> : null}
      {list.data?.actions.publish && quarterId !== null ? (
        <PublishForm
          quarterId={quarterId}
          quarterLabel={quarters.data?.find((q) => q.id === quarterId)?.label ?? ''}
        />
      ) : null}
      {list.data && list.data.reports.length === 0 ? (
        <EmptyState
          icon="document"
          title="No report published yet"
          description={
            quarterId === null
              ? 'Choose an audit quarter to publish its benchmark.'
              : 'Nothing has been published from this quarter.'
          }
        />
      ) : null}
      {list.data && list.data.reports.length > 0 ? (
        <ReportTable reports={list.data.reports} />
      ) : null}
    </div>
  );
}

function ReportTable({ reports }: { reports: Report[] }) {
  return (
    <HTMLTable compact striped className="cairn-reports-table">
      <thead>
        <tr>
          <th scope="col">Report</th>
          <th scope="col">Status</th>
          <th scope="col">Published</th>
          <th scope="col">Release note</th>
          <th scope="col">Practices</th>
        </tr>
      </thead>
      <tbody>
        {reports.map((r) => (
          <tr key={r.id}>
            <th scope="row">
              <Link to={r.permalink}>{r.label}</Link>
              <div className="cairn-muted cairn-small">measure set {r.measureSetId}</div>
            </th>
            <td>
              <ReportStatusTag status={r.status} />
            </td>
            <td>
              {formatDateTime(r.publishedAt)}
              <div className="cairn-muted cairn-small">by {r.publishedBy}</div>
            </td>
            <td className="cairn-report-note">
              {r.withdrawal ? `Withdrawn: ${r.withdrawal.reason}` : r.releaseNote}
            </td>
            <td>{r.submissionCount}</td>
          </tr>
        ))}
      </tbody>
    </HTMLTable>
  );
}

function PublishForm({ quarterId, quarterLabel }: { quarterId: number; quarterLabel: string }) {
  const publish = usePublishReport();
  const navigate = useNavigate();
  const [note, setNote] = useState('');
  const problems = fieldProblems(publish.error);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    publish.mutate(
      { quarterId, releaseNote: note },
      { onSuccess: (report) => void navigate(report.permalink) },
    );
  };
  return (
    <form className="cairn-publish-form" onSubmit={submit} noValidate>
      <Card>
        <H2>Publish {quarterLabel}</H2>
        <p>
          Publishing freezes the benchmark of the practices’ current submissions for {quarterLabel}:
          every practice’s results, the region’s, funnels and trends. Practice leads then read their
          own practice in full and other practices under disclosure control. An earlier report of
          the quarter stays readable, marked replaced.
        </p>
        <ClinicalCaution compact />
        <FormGroup
          label="Release note"
          labelFor="release-note"
          labelInfo="(required)"
          helperText={
            problems.get('releaseNote') ?? 'What readers of this report should know about it.'
          }
          intent={problems.has('releaseNote') ? Intent.DANGER : Intent.NONE}
        >
          <TextArea
            id="release-note"
            fill
            rows={3}
            value={note}
            maxLength={2000}
            onChange={(e) => setNote(e.target.value)}
            intent={problems.has('releaseNote') ? Intent.DANGER : Intent.NONE}
          />
        </FormGroup>
        {publish.error && !problems.has('releaseNote') ? (
          <ProblemCallout error={publish.error} />
        ) : null}
        <Button type="submit" intent={Intent.PRIMARY} icon="upload" loading={publish.isPending}>
          Publish report
        </Button>
      </Card>
    </form>
  );
}
