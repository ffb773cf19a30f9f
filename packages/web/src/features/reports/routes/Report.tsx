import {
  AnchorButton,
  Button,
  Callout,
  Dialog,
  DialogBody,
  DialogFooter,
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
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { EmptyState, Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { DisclosedCell, Report as ReportType, ReportPractice } from '../../../lib/api/types';
import { fieldProblems } from '../../../lib/field-problems';
import { formatDateTime, formatPercent } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import {
  downloads,
  useReport,
  useReportPractice,
  useReportRegion,
  useWithdrawReport,
} from '../api/reports';
import { ReportStatusTag } from './ReportStatusTag';
import './Reports.css';

const BANDS: Record<string, string> = {
  within: 'within the limits',
  notable: 'beyond the inner limit',
  outlier: 'beyond the outer limit',
};

const bandWords = (flag: { band: string | null; side: string | null }) =>
  flag.band === null
    ? '—'
    : flag.band === 'within' || flag.side === null
      ? BANDS[flag.band]
      : `${BANDS[flag.band]}, ${flag.side}`;

const cellText = (c: DisclosedCell) => c.display;

/**
 * `/reports/:reportId`: a report's permanent page. Its identity (who
 * published it, when, the release note, the content hash), its standing
 * (replaced, or the tombstone of a withdrawn report), downloads, and its
 * figures exactly as published: the region's for regional leads and
 * auditors, a practice's part for the practice's leads.
 */
export function Report() {
  const id = Number(useParams().reportId);
  const report = useReport(id);
  usePageTitle(report.data ? report.data.label : 'Report');
  const [withdrawing, setWithdrawing] = useState(false);
  const r = report.data;
  return (
    <div className="cairn-report">
      <ProblemCallout error={report.error} />
      {report.isPending ? <Spinner aria-label="Loading the report" /> : null}
      {r ? (
        <>
          <div className="cairn-page-head">
            <div>
              <H1 className="cairn-page-title">
                {r.label} <ReportStatusTag status={r.status} />
              </H1>
              <p className="cairn-muted">
                <Link to={`/reports?quarter=${r.quarterId}`}>All reports of {r.quarterLabel}</Link>
              </p>
            </div>
            {r.actions.withdraw ? (
              <Button icon="disable" intent={Intent.DANGER} onClick={() => setWithdrawing(true)}>
                Withdraw
              </Button>
            ) : null}
          </div>
          <Identity report={r} />
          {r.status !== 'withdrawn' ? (
            <>
              <ClinicalCaution />
              {r.actions.region ? <RegionPart report={r} /> : null}
              <PracticePart report={r} />
            </>
          ) : null}
          {withdrawing ? <WithdrawDialog report={r} onClose={() => setWithdrawing(false)} /> : null}
        </>
      ) : null}
    </div>
  );
}

function Identity({ report: r }: { report: ReportType }) {
  return (
    <section aria-label="About this report">
      {r.withdrawal ? (
        <Notice intent={Intent.DANGER} icon="disable" title="This report was withdrawn">
          Withdrawn {formatDateTime(r.withdrawal.at)} by {r.withdrawal.by}: {r.withdrawal.reason}.
          Its figures are no longer shown.
        </Notice>
      ) : null}
      {r.replacedBy ? (
        <Notice
          intent={Intent.WARNING}
          icon="swap-horizontal"
          title="A later report replaced this one"
        >
          <Link to={`/reports/${r.replacedBy.id}`}>{r.replacedBy.label}</Link> was published from
          the same quarter. This report stays readable as it was published.
        </Notice>
      ) : null}
      <dl className="cairn-report-identity">
        <dt>Audit quarter</dt>
        <dd>{r.quarterLabel}</dd>
        <dt>Published</dt>
        <dd>
          {formatDateTime(r.publishedAt)} by {r.publishedBy}
        </dd>
        <dt>Release note</dt>
        <dd>{r.releaseNote}</dd>
        <dt>Measure set</dt>
        <dd>
          <Link to={`/measure-sets/${encodeURIComponent(r.measureSetId)}`}>{r.measureSetId}</Link>
        </dd>
        <dt>Computed from</dt>
        <dd>{r.submissionCount} submissions</dd>
        <dt>Content hash (SHA-256)</dt>
        <dd>
          <code>{r.contentHash}</code>
        </dd>
      </dl>
    </section>
  );
}

function RegionPart({ report }: { report: ReportType }) {
  const region = useReportRegion(report.id, true);
  const all = region.data?.splits[0];
  return (
    <section className="cairn-report-section" aria-labelledby="region-heading">
      <H2 id="region-heading">The region</H2>
      <div className="cairn-report-downloads">
        <AnchorButton icon="th" href={downloads.regionPack(report.id)} download>
          Region data pack (XLSX)
        </AnchorButton>
        <AnchorButton icon="document" href={downloads.regionPdf(report.id)} download>
          Region report (PDF)
        </AnchorButton>
      </div>
      <ProblemCallout error={region.error} />
      {region.isPending ? <Spinner aria-label="Loading the region's figures" /> : null}
      {all ? (
        <HTMLTable compact striped>
          <caption className="cairn-muted">
            Everyone, {all.practices.length} practices with results; {all.coverage.missing.length}{' '}
            without a confirmed extract when published
          </caption>
          <thead>
            <tr>
              <th scope="col">Measure</th>
              <th scope="col">Region rate</th>
              <th scope="col">Median of practices</th>
              <th scope="col">Practices</th>
              <th scope="col">Guideline</th>
            </tr>
          </thead>
          <tbody>
            {all.measures.map((m, i) => {
              const r = all.region[i]!;
              return (
                <tr key={m.key}>
                  <th scope="row">{m.label}</th>
                  <td>{formatPercent(r.theta0)}</td>
                  <td>{formatPercent(r.median)}</td>
                  <td>{r.practices}</td>
                  <td className="cairn-small">{m.source}</td>
                </tr>
              );
            })}
          </tbody>
        </HTMLTable>
      ) : null}
    </section>
  );
}

function PracticePart({ report }: { report: ReportType }) {
  const [params, setParams] = useSearchParams();
  const asked = params.get('practice');
  const practiceId = asked ? Number(asked) : (report.practices[0]?.id ?? null);
  const part = useReportPractice(report.id, practiceId);
  if (report.practices.length === 0) {
    return (
      <EmptyState
        icon="office"
        title="No practice of yours is in this report"
        description="The report holds the practices that had a confirmed extract when it was published."
      />
    );
  }
  return (
    <section className="cairn-report-section" aria-labelledby="practice-heading">
      <H2 id="practice-heading">A practice’s report</H2>
      <FormGroup label="Practice" labelFor="report-practice" inline>
        <HTMLSelect
          id="report-practice"
          value={practiceId ?? ''}
          onChange={(e) => setParams({ practice: e.target.value })}
        >
          {report.practices.map((p) => (
            <option key={p.id} value={p.id}>
              {p.code} {p.name}
            </option>
          ))}
        </HTMLSelect>
      </FormGroup>
      <ProblemCallout error={part.error} />
      {part.isPending && practiceId !== null ? (
        <Spinner aria-label="Loading the practice's figures" />
      ) : null}
      {part.data ? <PracticeFigures part={part.data} reportId={report.id} /> : null}
    </section>
  );
}

function PracticeFigures({ part, reportId }: { part: ReportPractice; reportId: number }) {
  const [measure, setMeasure] = useState<string | null>(null);
  if (part.state === 'not-in-report' || !part.results) {
    return <Callout icon="info-sign">{part.message}</Callout>;
  }
  const results = part.results;
  const peers = part.peers.find((t) => t.measure === (measure ?? part.peers[0]?.measure));
  return (
    <>
      <div className="cairn-report-downloads">
        <AnchorButton icon="th" href={downloads.practicePack(reportId, part.practice.id)} download>
          {part.practice.code} data pack (XLSX)
        </AnchorButton>
        <AnchorButton
          icon="document"
          href={downloads.practicePdf(reportId, part.practice.id)}
          download
        >
          {part.practice.code} report (PDF)
        </AnchorButton>
      </div>
      <HTMLTable compact striped>
        <caption className="cairn-muted">
          {part.practice.code} {part.practice.name}: everyone. Region figures are under disclosure
          control.
        </caption>
        <thead>
          <tr>
            <th scope="col">Measure</th>
            <th scope="col">Met / denominator</th>
            <th scope="col">Rate (95 % interval)</th>
            <th scope="col">Region</th>
            <th scope="col">Against the funnel limits</th>
            <th scope="col">Guideline</th>
          </tr>
        </thead>
        <tbody>
          {results.measures.map((m) => {
            const s = m.splits.find((x) => x.split === 'all');
            if (!s) return null;
            return (
              <tr key={m.measure.key}>
                <th scope="row">{m.measure.label}</th>
                <td>
                  {s.own.events} / {s.own.n}
                </td>
                <td>
                  {formatPercent(s.own.rate)} ({formatPercent(s.own.interval.lower)} –{' '}
                  {formatPercent(s.own.interval.upper)})
                </td>
                <td>{s.region.rate === null ? 'withheld' : formatPercent(s.region.rate)}</td>
                <td>{bandWords(s.own.exact)}</td>
                <td className="cairn-small">{m.measure.source}</td>
              </tr>
            );
          })}
        </tbody>
      </HTMLTable>
      <div className="cairn-report-section">
        <FormGroup label="Practices on a measure" labelFor="peer-measure" inline>
          <HTMLSelect
            id="peer-measure"
            value={peers?.measure ?? ''}
            onChange={(e) => setMeasure(e.target.value)}
          >
            {results.measures.map((m) => (
              <option key={m.measure.key} value={m.measure.key}>
                {m.measure.label}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        {peers ? (
          <HTMLTable compact striped>
            <caption className="cairn-muted">
              Other practices under disclosure control: counts from 1 to 4 read “&lt; 5”; others are
              withheld where a total would give one away; rates of fewer than 10 are withheld.
            </caption>
            <thead>
              <tr>
                <th scope="col">Practice</th>
                <th scope="col">Met</th>
                <th scope="col">Not met</th>
                <th scope="col">Denominator</th>
                <th scope="col">Rate</th>
              </tr>
            </thead>
            <tbody>
              {peers.rows.map((row) => (
                <tr key={row.practice.id} className={row.own ? 'cairn-own-row' : undefined}>
                  <th scope="row">
                    {row.practice.code} {row.practice.name}
                    {row.own ? ' (yours)' : ''}
                  </th>
                  <td>{cellText(row.met)}</td>
                  <td>{cellText(row.notMet)}</td>
                  <td>{cellText(row.n)}</td>
                  <td>{row.rate === null ? 'withheld' : formatPercent(row.rate)}</td>
                </tr>
              ))}
            </tbody>
            <tfoot>
              <tr>
                <th scope="row">Region</th>
                <td>{cellText(peers.met)}</td>
                <td>{cellText(peers.notMet)}</td>
                <td>{cellText(peers.n)}</td>
                <td>{peers.rate === null ? 'withheld' : formatPercent(peers.rate)}</td>
              </tr>
            </tfoot>
          </HTMLTable>
        ) : null}
      </div>
    </>
  );
}

function WithdrawDialog({ report, onClose }: { report: ReportType; onClose: () => void }) {
  const withdraw = useWithdrawReport();
  const [reason, setReason] = useState('');
  const problems = fieldProblems(withdraw.error);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    withdraw.mutate({ id: report.id, reason }, { onSuccess: onClose });
  };
  return (
    <Dialog isOpen onClose={onClose} title={`Withdraw ${report.label}`} icon="disable">
      <form onSubmit={submit} noValidate>
        <DialogBody>
          <p>
            A withdrawn report’s figures, data packs and PDFs are no longer served. Its page keeps
            the reason and who withdrew it.
          </p>
          <FormGroup
            label="Reason"
            labelFor="withdraw-reason"
            labelInfo="(required)"
            helperText={problems.get('reason') ?? 'Readers see it in the report’s place.'}
            intent={problems.has('reason') ? Intent.DANGER : Intent.NONE}
          >
            <TextArea
              id="withdraw-reason"
              fill
              rows={3}
              value={reason}
              maxLength={2000}
              onChange={(e) => setReason(e.target.value)}
              intent={problems.has('reason') ? Intent.DANGER : Intent.NONE}
            />
          </FormGroup>
          {withdraw.error && !problems.has('reason') ? (
            <ProblemCallout error={withdraw.error} />
          ) : null}
        </DialogBody>
        <DialogFooter
          actions={
            <>
              <Button onClick={onClose}>Cancel</Button>
              <Button type="submit" intent={Intent.DANGER} loading={withdraw.isPending}>
                Withdraw report
              </Button>
            </>
          }
        />
      </form>
    </Dialog>
  );
}
