import {
  Button,
  Callout,
  FormGroup,
  H1,
  H2,
  HTMLSelect,
  HTMLTable,
  InputGroup,
  Intent,
  Spinner,
  Tab,
  Tabs,
} from '@blueprintjs/core';
import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { DateField } from '../../../components/DateField';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import { usePageTitle } from '../../../lib/page-title';
import { fromRegionDate, fromRegionTime } from '../../../lib/region-dates';
import { useRecipients } from '../api/deliveries';
import { DigestFrame } from '../components/DigestFrame';
import {
  useChangeSchedule,
  useDigestPreview,
  useDigestReports,
  useDigestSchedule,
  useSendAll,
  useSendTest,
} from '../api/digests';
import './digests.css';

/** `/digests`: the regional lead previews a practice's digest as sent, tests it, sends them all. */
export function Digests() {
  usePageTitle('Digests');
  return (
    <RequireRole roles={['regional_lead']}>
      <DigestsScreen />
    </RequireRole>
  );
}

const dateTime = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'long',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  timeZone: 'UTC',
  timeZoneName: 'short',
});

function DigestsScreen() {
  const [params, setParams] = useSearchParams();
  const reports = useDigestReports();
  const recipients = useRecipients();
  const reportList = reports.data ?? [];
  const practices = (recipients.data?.practices ?? []).map((p) => p.practice);
  const reportId = Number(params.get('report')) || reportList[0]?.id || null;
  const practiceId = Number(params.get('practice')) || practices[0]?.id || null;
  const report = reportList.find((r) => r.id === reportId) ?? null;
  const preview = useDigestPreview(reportId, practiceId);
  const set = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    next.set(key, value);
    setParams(next, { replace: true });
  };

  return (
    <div className="cairn-digests">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Digests</H1>
          <p className="cairn-muted">
            Each practice&rsquo;s leads get a digest of its part of a report: where it stands
            against the region, what changed, where improvement would matter most, with the
            practice&rsquo;s data pack of the report attached. Look at any practice&rsquo;s digest
            here exactly as it will be sent, send yourself a test, then send them all.
          </p>
        </div>
      </div>
      <ProblemCallout error={reports.error ?? recipients.error} />
      <div className="cairn-digests-pick">
        <FormGroup label="Report" labelFor="digest-report">
          <HTMLSelect
            id="digest-report"
            value={reportId ?? ''}
            onChange={(e) => set('report', e.currentTarget.value)}
          >
            {reportList.map((r) => (
              <option key={r.id} value={r.id}>
                {r.label}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        <FormGroup label="Practice" labelFor="digest-practice">
          <HTMLSelect
            id="digest-practice"
            value={practiceId ?? ''}
            onChange={(e) => set('practice', e.currentTarget.value)}
          >
            {practices.map((p) => (
              <option key={p.id} value={p.id}>
                {p.code} · {p.name}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
      </div>

      {report && <SendPanel reportId={report.id} practices={report.practices} />}

      <H2>Preview</H2>
      <ProblemCallout error={preview.error} />
      {preview.isPending && reportId !== null && practiceId !== null ? (
        <Spinner aria-label="Composing the digest" />
      ) : preview.data ? (
        <>
          <HTMLTable compact className="cairn-digests-headers">
            <tbody>
              <tr>
                <th scope="row">From</th>
                <td>{preview.data.from}</td>
              </tr>
              <tr>
                <th scope="row">To</th>
                <td>
                  {preview.data.recipients.length === 0
                    ? 'Nobody: the practice has no active lead who receives digests and no extra address'
                    : preview.data.recipients
                        .map((r) => (r.name ? `${r.name} <${r.address}>` : r.address))
                        .join(', ')}
                </td>
              </tr>
              <tr>
                <th scope="row">Subject</th>
                <td>{preview.data.subject}</td>
              </tr>
              <tr>
                <th scope="row">Attachment</th>
                <td>
                  {preview.data.attachment
                    ? `${preview.data.attachment.filename} (${Math.ceil(preview.data.attachment.bytes / 1024)} kB)`
                    : 'None: the practice has no figures in this report'}
                </td>
              </tr>
            </tbody>
          </HTMLTable>
          {!preview.data.reviewCasesCounted && (
            <p className="cairn-muted">
              Review cases are not counted in digests yet: each says that none is waiting.
            </p>
          )}
          <SendTest reportId={preview.data.report.id} practiceId={preview.data.practice.id} />
          <Tabs id="digest-parts" renderActiveTabPanelOnly>
            <Tab
              id="html"
              title="As most mail programs show it"
              panel={
                <DigestFrame
                  title={`Digest for ${preview.data.practice.code}, HTML part`}
                  src={preview.data.htmlPath}
                />
              }
            />
            <Tab
              id="text"
              title="Plain text"
              panel={
                <pre className="cairn-digests-text" aria-label="Plain-text part">
                  {preview.data.text}
                </pre>
              }
            />
          </Tabs>
        </>
      ) : null}
      <ClinicalCaution compact />
    </div>
  );
}

function SendTest({ reportId, practiceId }: { reportId: number; practiceId: number }) {
  const test = useSendTest();
  return (
    <div className="cairn-digests-actions">
      <Button
        icon="envelope"
        loading={test.isPending}
        onClick={() => test.mutate({ reportId, practiceId })}
      >
        Send this digest to me
      </Button>
      {test.data && (
        <span role="status">
          Sent to {test.data.to}; the mail server replied {test.data.reply}.
        </span>
      )}
      <ProblemCallout error={test.error} />
    </div>
  );
}

function SendPanel({ reportId, practices }: { reportId: number; practices: number }) {
  const sendAll = useSendAll();
  const schedule = useDigestSchedule(reportId);
  const change = useChangeSchedule();
  // The day in the region's format (DD/MM/YYYY) and the time on the 24-hour clock, read here
  // as this browser's local time; the API checks that it lies ahead.
  const [day, setDay] = useState('');
  const [time, setTime] = useState('');
  const [checked, setChecked] = useState(false);
  const parsedDay = fromRegionDate(day);
  const parsedTime = fromRegionTime(time);
  const dayError = checked && !parsedDay.ok ? parsedDay.message : undefined;
  const timeError = checked && !parsedTime.ok ? parsedTime.message : undefined;
  const s = schedule.data;
  return (
    <section className="cairn-digests-send" aria-label="Send the digests">
      <div className="cairn-digests-actions">
        <Button
          intent={Intent.PRIMARY}
          icon="send-message"
          loading={sendAll.isPending}
          onClick={() => sendAll.mutate(reportId)}
        >
          Send to all {practices} practices now
        </Button>
        <span className="cairn-muted">
          A practice&rsquo;s digests are sent once: sending again adds only practices not sent
          before.
        </span>
      </div>
      {sendAll.data && (
        <Callout intent={Intent.SUCCESS} role="status">
          {sendAll.data.messages} messages to {sendAll.data.practices} practices queued
          {sendAll.data.alreadyQueued > 0 &&
            `; ${sendAll.data.alreadyQueued} practices had theirs already`}
          . <Link to={`/deliveries/digest/${reportId}`}>Follow their delivery</Link>.
        </Callout>
      )}
      <ProblemCallout error={sendAll.error} />
      <form
        className="cairn-digests-actions cairn-digests-when"
        aria-label="Schedule the digests"
        onSubmit={(e) => {
          e.preventDefault();
          setChecked(true);
          if (!parsedDay.ok || !parsedTime.ok) return;
          const sendAt = new Date(`${parsedDay.iso}T${parsedTime.time}:00`).toISOString();
          change.mutate({ reportId, sendAt });
        }}
        noValidate
      >
        <DateField
          id="digest-day"
          label="Or send them on"
          value={day}
          onChange={setDay}
          error={dayError}
        />
        <FormGroup
          label="at"
          labelFor="digest-time"
          labelInfo="(HH:MM, 24-hour)"
          intent={timeError ? Intent.DANGER : Intent.NONE}
          helperText={timeError ? <span id="digest-time-help">{timeError}</span> : undefined}
        >
          <InputGroup
            id="digest-time"
            value={time}
            onValueChange={setTime}
            placeholder="HH:MM"
            inputMode="numeric"
            autoComplete="off"
            intent={timeError ? Intent.DANGER : Intent.NONE}
            aria-invalid={timeError ? true : undefined}
            aria-describedby={timeError ? 'digest-time-help' : undefined}
            leftIcon="time"
          />
        </FormGroup>
        <Button type="submit" icon="time" loading={change.isPending}>
          Schedule
        </Button>
        {s?.state === 'scheduled' && (
          <Button
            icon="cross"
            loading={change.isPending}
            onClick={() => change.mutate({ reportId, cancel: true })}
          >
            Cancel the scheduled sending
          </Button>
        )}
      </form>
      {s && s.state !== 'none' && (
        <p role="status">
          {s.state === 'scheduled' &&
            `Scheduled for ${dateTime.format(new Date(s.sendAt!))} ${
              s.scheduledBy === 'on publication' ? 'by Cairn on publication' : `by ${s.scheduledBy}`
            }.`}
          {s.state === 'sent' &&
            `Sent by schedule on ${dateTime.format(new Date(s.ranAt!))}: ${s.outcome}.`}
          {s.state === 'cancelled' && 'The scheduled sending was cancelled.'}
        </p>
      )}
      <ProblemCallout error={change.error} />
    </section>
  );
}
