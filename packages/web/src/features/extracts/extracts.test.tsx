import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from '../../../test/render';
import type {
  Coverage,
  IssuePage,
  Me,
  Quarter,
  Submission,
  SubmissionHistory,
  UploadOptions,
} from '../../lib/api/types';
import { fillWidths, rowHeightsFor, wrappedLines } from './components/IssuesTable';
import { about } from '../../../test/signed-in';

const priya: Me = {
  id: 3,
  email: 'priya@x.example',
  displayName: 'Priya Calloway',
  role: 'practice_lead',
  regionName: 'Ostrevale',
  practices: [{ id: 12, code: 'OV102', name: 'Quarrybank Surgery' }],
  sessionExpiresAt: '2026-12-01T18:00:00.000Z',
};
const auditor: Me = {
  ...priya,
  id: 5,
  displayName: 'Tobias Renwick',
  role: 'auditor',
  practices: [],
};
const regional: Me = {
  ...priya,
  id: 1,
  displayName: 'Imogen Varley',
  role: 'regional_lead',
  practices: [],
};

const q3: Quarter = {
  id: 8,
  regionId: 1,
  year: 2026,
  quarter: 3,
  label: '2026 Q3',
  windowStart: '2025-10',
  windowEnd: '2026-09',
  measureSetId: 'cairn-default-2026.1',
  submissionDeadline: '2026-12-16',
  status: 'open',
  openedAt: '2026-10-01T09:00:00.000Z',
  closedAt: null,
};
const q2: Quarter = { ...q3, id: 7, quarter: 2, label: '2026 Q2', status: 'closed' };

function submission(over: Partial<Submission> = {}): Submission {
  return {
    id: 41,
    status: 'awaiting_confirmation',
    statusLabel: 'Awaiting confirmation',
    phase: null,
    isCurrent: false,
    practice: { id: 12, code: 'OV102', name: 'Quarrybank Surgery' },
    quarter: q3,
    file: {
      name: 'q3.xlsx',
      sizeBytes: 48_213,
      sha256: 'ab'.repeat(32),
      kind: 'xlsx',
      sheetName: 'data',
      dateConvention: null,
      delimiter: null,
      encoding: null,
      kept: false,
    },
    uploadedBy: 'Priya Calloway',
    uploadedAt: '2026-12-01T10:00:00.000Z',
    processingStartedAt: '2026-12-01T10:00:01.000Z',
    processedAt: '2026-12-01T10:00:03.000Z',
    confirmedAt: null,
    confirmedBy: null,
    cancelledAt: null,
    cancelledBy: null,
    supersededAt: null,
    supersededBySubmissionId: null,
    failedAt: null,
    progress: { rowsDone: 51, rowsTotal: 51 },
    counts: {
      rowsRead: 51,
      rowsAccepted: 48,
      rowsRejected: 3,
      rowsBlank: 0,
      errors: 3,
      warnings: 2,
      flags: 1,
    },
    issuesByCode: [
      {
        code: 'out_of_range',
        severity: 'error',
        title: 'Value outside the plausible range',
        count: 2,
      },
      { code: 'invalid_date', severity: 'error', title: 'Not a date', count: 1 },
      {
        code: 'unit_converted',
        severity: 'warning',
        title: 'Value converted to Cairn’s unit',
        count: 2,
      },
      {
        code: 'type1_not_on_insulin',
        severity: 'flag',
        title: 'Type 1 diabetes but not on insulin',
        count: 1,
      },
    ],
    refusal: null,
    failure: null,
    headerRow: 1,
    columnsFound: ['record_ref'],
    columnsIgnored: [],
    actions: { confirm: true, cancel: true, retry: false, upload: true },
    ...over,
  };
}

const issuePage: IssuePage = {
  total: 2,
  offset: 0,
  limit: 500,
  recordRefsShown: true,
  columns: [
    { column: 'hba1c_value', count: 2 },
    { column: 'bp_date', count: 1 },
  ],
  items: [
    {
      seq: 1,
      severity: 'error',
      code: 'out_of_range',
      title: 'Value outside the plausible range',
      row: 5,
      column: 'hba1c_value',
      columnKey: 'hba1c_value',
      value: '900',
      message: 'HbA1c 900 mmol/mol is outside the plausible range',
      fix: 'Check the value',
    },
    {
      seq: 2,
      severity: 'error',
      code: 'invalid_date',
      title: 'Not a date',
      row: 9,
      column: 'bp_date',
      columnKey: 'bp_date',
      value: 'soon',
      message: 'Not a date',
      fix: 'Write the date as YYYY-MM-DD',
    },
  ],
};

const missingBirthYear = {
  code: 'missing_columns',
  title: 'Required columns missing',
  message: 'The file has no column birth_year.',
  fix: 'Add the column birth_year, as in Cairn’s template.',
  detail: null,
};

/** A refusal as the API sends it: its primary problem, and every problem found. */
function refusalOf(problems: NonNullable<Submission['refusal']>['problems']) {
  return { ...problems[0]!, problems };
}

const current = submission({
  id: 30,
  status: 'accepted',
  statusLabel: 'Accepted',
  isCurrent: true,
  uploadedAt: '2026-11-01T10:00:00.000Z',
  actions: { confirm: false, cancel: false, retry: false, upload: true },
});

/** A practice's history; `upload`: the API's upload action in the open quarter (a practice lead's). */
function history(
  subs: Submission[],
  currentId: number | null = 30,
  upload = true,
): SubmissionHistory {
  return {
    practice: { id: 12, code: 'OV102', name: 'Quarrybank Surgery' },
    quarters: [
      { quarter: q3, currentSubmissionId: currentId, submissions: subs, actions: { upload } },
      { quarter: q2, currentSubmissionId: null, submissions: [], actions: { upload: false } },
    ],
  };
}

/** Where the API lets a person upload: these practices, each to these quarters. */
function uploadOptions(
  practices: Me['practices'],
  quarterIds: number[],
  quarters: Quarter[] = [q3, q2],
): UploadOptions {
  return {
    practices: practices.map((p) => ({
      practice: { ...p, localityName: 'Harnleigh Fold' },
      quarterIds,
    })),
    quarters,
  };
}

type Answer = { status?: number; body: unknown };
type Handler = (path: string, init: RequestInit | undefined) => Answer | undefined;

/** A fetch answering from a function of the path (with its query) and the request. */
function stubApi(user: Me, handler: Handler) {
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const path = url.replace(/^https?:\/\/[^/]+/, '');
    const answer: Answer | undefined =
      path === '/api/about'
        ? { body: about }
        : path === '/api/session'
          ? { body: { user, csrfToken: 'tok' } }
          : handler(path, init);
    const status = answer?.status ?? (answer ? 200 : 404);
    const body = answer?.body ?? { type: '/api/problems/not-found', title: 'Not found', status };
    return new Response(JSON.stringify(body), {
      status,
      headers: { 'Content-Type': status >= 400 ? 'application/problem+json' : 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

const pathsOf = (mock: ReturnType<typeof stubApi>) =>
  (mock.mock.calls as unknown as [string, RequestInit | undefined][]).map((c) => String(c[0]));

afterEach(() => vi.unstubAllGlobals());

describe('submission page', () => {
  it('shows a real progress bar while Cairn checks the file, then the report', async () => {
    let state: Submission = submission({
      status: 'processing',
      statusLabel: 'Processing',
      phase: 'reading',
      progress: { rowsDone: 250, rowsTotal: 1000 },
      counts: null,
      issuesByCode: [],
      actions: { confirm: false, cancel: true, retry: false, upload: true },
    });
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: state };
      if (path === '/api/practices/12/submissions') return { body: history([state, current]) };
      if (path.startsWith('/api/practices/12/submissions/41/issues')) return { body: issuePage };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    const bar = await screen.findByRole('progressbar', { name: 'Rows checked' });
    expect(bar.getAttribute('aria-valuenow')).toBe('25');
    expect(screen.getAllByText('250 of 1,000 rows checked').length).toBeGreaterThan(0);
    expect(screen.getByText('Processing').closest('.bp6-tag')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Cancel submission' })).toBeTruthy();

    state = submission();
    const summary = await screen.findByRole('region', { name: 'Summary' }, { timeout: 4000 });
    expect(within(summary).getByText('Rows read')).toBeTruthy();
    expect(screen.queryByRole('progressbar', { name: 'Rows checked' })).toBeNull();
    expect(screen.getByText('Awaiting confirmation', { selector: '.bp6-tag *' })).toBeTruthy();
  });

  it('sums up the report: rows read, accepted, refused, warnings by code; flags carry the clinical caution', async () => {
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: submission() };
      if (path === '/api/practices/12/submissions')
        return { body: history([submission(), current]) };
      if (path.startsWith('/api/practices/12/submissions/41/issues')) return { body: issuePage };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    const summary = await screen.findByRole('region', { name: 'Summary' });
    const figure = (label: string) =>
      within(summary)
        .getByText(label)
        .closest('.cairn-figure')
        ?.querySelector('.cairn-figure-value')?.textContent;
    expect(figure('Rows read')).toBe('51');
    expect(figure('Rows accepted')).toBe('48');
    expect(figure('Rows refused')).toBe('3');
    expect(figure('Warnings')).toBe('2');
    expect(figure('Data-quality flags')).toBe('1');
    // Problems in words; the code only as a tooltip, for support.
    const byKind = within(summary).getByRole('table', { name: 'Issues by kind' });
    expect(within(byKind).queryByText('unit_converted')).toBeNull();
    expect(within(byKind).getByText('Value converted to Cairn’s unit').getAttribute('title')).toBe(
      'Code: unit_converted',
    );
    // The clinical caution once on the page, beside the flags.
    expect(screen.getAllByText(/not clinical advice/)).toHaveLength(1);
    expect(screen.getByText('Audit and improvement support')).toBeTruthy();
    expect(screen.getByRole('button', { name: /Refused rows \(XLSX\)/ }).getAttribute('href')).toBe(
      '/api/practices/12/submissions/41/rejected-rows.xlsx',
    );
    expect(screen.getByRole('button', { name: /Full report \(JSON\)/ }).getAttribute('href')).toBe(
      '/api/practices/12/submissions/41/report.json',
    );
    expect(await screen.findByText('1–2 of 2 issues')).toBeTruthy();
  });

  it('asks the server for filtered and sorted issues', async () => {
    const fetchMock = stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: submission() };
      if (path === '/api/practices/12/submissions')
        return { body: history([submission(), current]) };
      if (path.startsWith('/api/practices/12/submissions/41/issues')) return { body: issuePage };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    await screen.findByText('1–2 of 2 issues');
    expect(pathsOf(fetchMock)).toContain('/api/practices/12/submissions/41/issues?limit=500');

    await userEvent.selectOptions(screen.getByRole('combobox', { name: 'Kind of issue' }), 'error');
    await waitFor(() =>
      expect(pathsOf(fetchMock)).toContain(
        '/api/practices/12/submissions/41/issues?severity=error&limit=500',
      ),
    );
    await userEvent.selectOptions(screen.getByRole('combobox', { name: 'Column' }), 'hba1c_value');
    await waitFor(() =>
      expect(pathsOf(fetchMock)).toContain(
        '/api/practices/12/submissions/41/issues?severity=error&column=hba1c_value&limit=500',
      ),
    );
    await userEvent.selectOptions(screen.getByRole('combobox', { name: 'Sort by' }), '-row');
    await waitFor(() =>
      expect(pathsOf(fetchMock)).toContain(
        '/api/practices/12/submissions/41/issues?severity=error&column=hba1c_value&sort=-row&limit=500',
      ),
    );
    await userEvent.click(screen.getByRole('button', { name: 'Clear filters' }));
    await userEvent.click(
      screen.getByRole('button', {
        name: 'Show only “Value outside the plausible range” in the table',
      }),
    );
    await waitFor(() =>
      expect(pathsOf(fetchMock)).toContain(
        '/api/practices/12/submissions/41/issues?code=out_of_range&sort=-row&limit=500',
      ),
    );
    const problem = screen.getByRole('combobox', { name: 'Problem' }) as HTMLSelectElement;
    expect(problem.value).toBe('out_of_range');
    expect(problem.selectedOptions[0]?.textContent).toBe('Value outside the plausible range (2)');
  });

  it('confirms through an alert that names the submission it replaces', async () => {
    let confirmed = false;
    const fetchMock = stubApi(priya, (path, init) => {
      if (path === '/api/practices/12/submissions/41/confirm' && init?.method === 'POST') {
        confirmed = true;
        return {
          body: submission({
            status: 'accepted',
            isCurrent: true,
            actions: { confirm: false, cancel: false, retry: false, upload: true },
          }),
        };
      }
      if (path === '/api/practices/12/submissions/41')
        return {
          body: confirmed
            ? submission({
                status: 'accepted',
                isCurrent: true,
                actions: { confirm: false, cancel: false, retry: false, upload: true },
              })
            : submission(),
        };
      if (path === '/api/practices/12/submissions')
        return { body: history([submission(), current]) };
      if (path.startsWith('/api/practices/12/submissions/41/issues')) return { body: issuePage };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    await screen.findByText(/Confirming it replaces submission 30/);
    await userEvent.click(screen.getByRole('button', { name: 'Confirm submission' }));
    const alert = await screen.findByRole('alertdialog');
    expect(within(alert).getByText(/It replaces the current submission 30/)).toBeTruthy();
    expect(within(alert).getByText(/will be marked\s+superseded/)).toBeTruthy();
    await userEvent.click(within(alert).getByRole('button', { name: 'Confirm submission' }));
    await screen.findByText('Current submission for 2026 Q3');
    const post = (fetchMock.mock.calls as unknown as [string, RequestInit | undefined][]).find(
      (c) => c[1]?.method === 'POST',
    )!;
    expect(post[0]).toBe('/api/practices/12/submissions/41/confirm');
    expect(new Headers(post[1]?.headers).get('X-CSRF-Token')).toBe('tok');
  });

  it('compares an extract awaiting confirmation with the current submission it would replace', async () => {
    const waiting = submission({
      counts: { ...submission().counts!, rowsRead: 12, rowsAccepted: 5, rowsRejected: 7 },
    });
    const current447 = {
      ...current,
      counts: { ...current.counts!, rowsRead: 447, rowsAccepted: 447, rowsRejected: 0 },
    };
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: waiting };
      if (path === '/api/practices/12/submissions') return { body: history([waiting, current447]) };
      if (path.startsWith('/api/practices/12/submissions/41/issues')) return { body: issuePage };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    const compare = await screen.findByRole('region', {
      name: 'Compare with the current submission',
    });
    expect(
      within(compare).getByText(
        /Confirming submission 41 replaces the 447 records of submission 30 with 5\. That is 442 fewer/,
      ),
    ).toBeTruthy();
    const row = within(compare).getByText('Rows refused (left out)').closest('tr')!;
    expect([...row.querySelectorAll('td')].map((td) => td.textContent)).toEqual(['7', '0']);
  });

  it('never shows write buttons to an auditor, who can still read and download', async () => {
    const readOnly = submission({
      actions: { confirm: false, cancel: false, retry: false, upload: false },
    });
    stubApi(auditor, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: readOnly };
      if (path === '/api/practices/12/submissions')
        return { body: history([readOnly, current], 30, false) };
      if (path.startsWith('/api/practices/12/submissions/41/issues'))
        return { body: { ...issuePage, recordRefsShown: false } };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    await screen.findByRole('region', { name: 'Summary' });
    expect(screen.queryByRole('button', { name: 'Confirm submission' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Cancel submission' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Check again' })).toBeNull();
    expect(screen.getByRole('button', { name: /Full report \(JSON\)/ })).toBeTruthy();
    expect(await screen.findByText(/Record references are shown as pseudonyms/)).toBeTruthy();
    expect(screen.queryByText(/upload the whole extract again/)).toBeNull();
    expect(screen.queryByRole('link', { name: 'Upload extract' })).toBeNull();
    expect(screen.getByRole('link', { name: 'Coverage' })).toBeTruthy();
  });

  it('puts a refused file’s message and its fix first', async () => {
    const rejected = submission({
      status: 'rejected',
      statusLabel: 'Rejected',
      counts: null,
      issuesByCode: [
        {
          code: 'missing_columns',
          severity: 'refusal',
          title: 'Required columns missing',
          count: 1,
        },
      ],
      refusal: refusalOf([missingBirthYear]),
      actions: { confirm: false, cancel: false, retry: false, upload: true },
    });
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: rejected };
      if (path === '/api/practices/12/submissions') return { body: history([rejected, current]) };
      if (path.startsWith('/api/practices/12/submissions/41/issues'))
        return { body: { ...issuePage, total: 0, items: [], columns: [] } };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    const alert = await screen.findByRole('alert');
    expect(within(alert).getByText('This file was refused: Required columns missing')).toBeTruthy();
    expect(within(alert).getByText('The file has no column birth_year.')).toBeTruthy();
    expect(within(alert).getByText('How to fix it')).toBeTruthy();
    expect(
      within(alert).getByText('Add the column birth_year, as in Cairn’s template.'),
    ).toBeTruthy();
    expect(
      within(alert)
        .getByRole('link', { name: /Upload a corrected extract/ })
        .getAttribute('href'),
    ).toBe('/extracts/upload?practice=12&quarter=8');
    // The code is kept for support, folded away.
    const support = within(alert).getByText('Details for support').closest('details')!;
    expect(support.open).toBe(false);
    expect(within(support as HTMLElement).getByText('missing_columns')).toBeTruthy();
  });

  it('lists every problem of the heading row, each with its fix, in one refusal', async () => {
    const identifier = {
      code: 'identifier_column',
      title: 'Column that identifies people',
      message: 'The file has a column that could identify people: “NHS number” (column AI).',
      fix: 'Delete that column from the file and upload again.',
      detail: null,
    };
    const rejected = submission({
      status: 'rejected',
      statusLabel: 'Rejected',
      counts: null,
      issuesByCode: [],
      refusal: {
        ...refusalOf([identifier, missingBirthYear]),
        message: 'The heading row has 2 problems.',
        fix: 'Fix each of them.',
      },
      actions: { confirm: false, cancel: false, retry: false, upload: true },
    });
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: rejected };
      if (path === '/api/practices/12/submissions') return { body: history([rejected, current]) };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    const alert = await screen.findByRole('alert');
    expect(
      within(alert).getByRole('heading', { name: 'This file was refused: 2 problems to fix' }),
    ).toBeTruthy();
    const items = within(alert).getAllByRole('listitem');
    expect(items.map((li) => within(li).getByRole('heading').textContent)).toEqual([
      'Column that identifies people',
      'Required columns missing',
    ]);
    expect(within(items[0]!).getByText(/Delete that column from the file/)).toBeTruthy();
    expect(within(items[1]!).getByText(/Add the column birth_year/)).toBeTruthy();
    expect(within(alert).queryByText('identifier_column', { selector: 'li *' })).toBeNull();
  });

  it('offers no new upload where the API allows none (a closed quarter, for a practice lead)', async () => {
    const closedQ2 = { ...q2 };
    const rejected = submission({
      status: 'rejected',
      statusLabel: 'Rejected',
      quarter: closedQ2,
      counts: null,
      issuesByCode: [],
      refusal: refusalOf([missingBirthYear]),
      actions: { confirm: false, cancel: false, retry: false, upload: false },
    });
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: rejected };
      if (path === '/api/practices/12/submissions') return { body: history([current]) };
      if (path.startsWith('/api/practices/12/submissions/41/issues'))
        return { body: { ...issuePage, total: 0, items: [], columns: [] } };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    const alert = await screen.findByRole('alert');
    expect(within(alert).getByText('The file has no column birth_year.')).toBeTruthy();
    expect(within(alert).queryByRole('link', { name: /Upload a corrected extract/ })).toBeNull();
  });

  it('offers Check again for a failed job whose file is kept', async () => {
    const failed = submission({
      status: 'failed',
      statusLabel: 'Failed',
      counts: null,
      issuesByCode: [],
      failure: { message: 'The database went away.', attempts: 3, canRetry: true },
      actions: { confirm: false, cancel: true, retry: true, upload: true },
    });
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions/41') return { body: failed };
      if (path === '/api/practices/12/submissions') return { body: history([failed, current]) };
      return undefined;
    });
    renderApp('/practices/12/submissions/41');
    expect(await screen.findByText('Cairn could not finish checking this extract')).toBeTruthy();
    expect(screen.getByText('The database went away.')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Check again' })).toBeTruthy();
  });
});

describe('issues table', () => {
  it('stretches its columns to the width it has, never below their narrowest', () => {
    const base = [50, 100, 150];
    expect(fillWidths(200, base)).toEqual(base);
    const wide = fillWidths(601, base);
    expect(wide.reduce((a, b) => a + b, 0)).toBe(601);
    expect(wide[0]).toBe(100);
    expect(wide[1]).toBe(200);
  });

  it('gives a long message the height it needs, so that no text is cut off', () => {
    const widths = fillWidths(1200);
    const short = {
      column: 'bp_date',
      value: 'x',
      title: 'Not a date',
      message: 'Not a date.',
      fix: 'Fix it.',
    };
    const long = {
      ...short,
      message: 'Type 1 diabetes is recorded but on_insulin is “no”. '.repeat(4),
    };
    const [a, b] = rowHeightsFor([short, long], widths);
    // One line of text: no taller than a tag needs.
    expect(a).toBe(28);
    expect(b).toBeGreaterThan(28);
    // The long message fits: its lines at the column's width, 16 px each.
    const perLine = Math.floor((widths[5]! - 20) / 6.1);
    expect(b).toBeGreaterThanOrEqual(Math.ceil(long.message.length / perLine) * 16);
    expect(b).toBe(wrappedLines(long.message, perLine) * 16 + 10);
    const huge = { ...short, fix: 'x'.repeat(5000) };
    expect(rowHeightsFor([huge], widths)[0]).toBe(8 * 16 + 10);
  });

  it('counts wrapped lines at word boundaries', () => {
    expect(wrappedLines('', 10)).toBe(1);
    expect(wrappedLines('one two', 10)).toBe(1);
    expect(wrappedLines('one two three', 10)).toBe(2);
    expect(wrappedLines('x'.repeat(25), 10)).toBe(3);
  });
});

describe('submissions history', () => {
  it('lists each quarter’s submissions with status tags in words and icons', async () => {
    const superseded = submission({
      id: 20,
      status: 'superseded',
      statusLabel: 'Superseded',
      actions: { confirm: false, cancel: false, retry: false, upload: true },
    });
    stubApi(priya, (path) => {
      if (path === '/api/practices/12/submissions')
        return { body: history([submission(), current, superseded]) };
      return undefined;
    });
    renderApp('/submissions');
    expect(await screen.findByText('Audit quarter 2026 Q3')).toBeTruthy();
    const row = (id: number) =>
      document.querySelector(`tr[data-submission="${id}"]`) as HTMLElement;
    for (const [id, label] of [
      [41, 'Awaiting confirmation'],
      [30, 'Accepted'],
      [20, 'Superseded'],
    ] as const) {
      const tag = within(row(id)).getByText(label).closest('.bp6-tag')!;
      expect(tag.querySelector('.bp6-icon')).toBeTruthy();
    }
    expect(within(row(30)).getByText('Current')).toBeTruthy();
    expect(within(row(41)).getByRole('link', { name: 'Submission 41' }).getAttribute('href')).toBe(
      '/practices/12/submissions/41',
    );
    expect(screen.getByText('No extract was sent for 2026 Q2.')).toBeTruthy();
  });

  it('sends an auditor, who has no practices of their own, to Coverage to choose one', async () => {
    stubApi(auditor, () => undefined);
    renderApp('/submissions');
    expect(await screen.findByText('Choose a practice')).toBeTruthy();
    expect(screen.queryByText(/not assigned to a practice/)).toBeNull();
    const state = screen.getByText('Choose a practice').closest('.bp6-non-ideal-state')!;
    const link = within(state as HTMLElement).getByRole('link', { name: 'Coverage' });
    expect(link.getAttribute('href')).toBe('/coverage');
  });
});

describe('upload page', () => {
  const format = {
    limits: { maxBytes: 10 * 1_048_576, maxRows: 5000 },
    columns: [
      {
        key: 'record_ref',
        group: 'person',
        meaning: 'Your reference for the record',
        allowed: 'text',
        required: 'required',
        columnRequired: true,
        valueRequired: true,
        units: [],
        codes: null,
        example: 'A-1',
      },
    ],
    issueCodes: [],
  };

  it('offers the templates, shows the server’s limits and explains an identical file', async () => {
    const fetchMock = stubApi(priya, (path, init) => {
      if (path === '/api/extracts/upload-options')
        return { body: uploadOptions(priya.practices, [q3.id]) };
      if (path === '/api/extracts/format') return { body: format };
      if (path === '/api/practices/12/submissions') return { body: history([current]) };
      if (path.startsWith('/api/practices/12/quarters/8/extracts') && init?.method === 'POST')
        return {
          status: 409,
          body: {
            type: '/api/problems/identical-extract',
            title: 'This file was already uploaded',
            status: 409,
            detail:
              'This file is identical to the extract uploaded on 2026-11-01 10:00 UTC by priya@x.example (submission 30), which is already the current submission for 2026 Q3. Nothing was changed.',
            code: 'identical_extract',
            submissionId: 30,
            submissionStatus: 'accepted',
          },
        };
      return undefined;
    });
    renderApp('/extracts/upload');
    expect(await screen.findByRole('heading', { name: 'Upload extract' })).toBeTruthy();
    expect(
      screen.getByRole('button', { name: /Download template \(XLSX\)/ }).getAttribute('href'),
    ).toBe('/api/extracts/template.xlsx');
    expect(
      screen.getByRole('button', { name: /Download template \(CSV\)/ }).getAttribute('href'),
    ).toBe('/api/extracts/template.csv');
    expect(await screen.findByText(/at most 10 MB and 5,000 rows/)).toBeTruthy();
    expect(screen.getByText('OV102 · Quarrybank Surgery')).toBeTruthy();
    expect(await screen.findByText(/A new extract replaces it only when/)).toBeTruthy();
    // Only open quarters for a practice lead.
    const quarter = screen.getByLabelText('Audit quarter') as HTMLSelectElement;
    expect([...quarter.options].map((o) => o.textContent)).toEqual([
      '2026 Q3 (deadline 16 Dec 2026)',
    ]);

    await userEvent.click(screen.getByLabelText('Day first: 04/05/2026 is 4 May 2026'));
    const file = new File(['record_ref\nA-1\n'], 'q3.csv', { type: 'text/csv' });
    await userEvent.upload(screen.getByLabelText('Extract file'), file);
    expect(screen.getByText('q3.csv')).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Upload and check' }));
    expect(await screen.findByText('This file was already uploaded')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Open submission 30' }).getAttribute('href')).toBe(
      '/practices/12/submissions/30',
    );
    const post = (fetchMock.mock.calls as unknown as [string, RequestInit | undefined][]).find(
      (c) => c[1]?.method === 'POST',
    )!;
    expect(post[0]).toBe('/api/practices/12/quarters/8/extracts?dateConvention=day_first');
    expect((post[1]?.body as FormData).get('file')).toBeInstanceOf(File);
  });

  it('says what is still to choose while the upload button cannot be pressed', async () => {
    const daniel: Me = {
      ...priya,
      id: 4,
      displayName: 'Daniel Oyelaran',
      practices: [
        { id: 11, code: 'OV101', name: 'Wrenfield Health Centre' },
        { id: 13, code: 'OV103', name: 'Harnleigh Old Mill Practice' },
      ],
    };
    stubApi(daniel, (path) => {
      if (path === '/api/extracts/upload-options')
        return { body: uploadOptions(daniel.practices, [q3.id], [q3]) };
      if (path === '/api/extracts/format') return { body: format };
      if (path === '/api/practices/11/submissions') return { body: history([]) };
      return undefined;
    });
    renderApp('/extracts/upload');
    const button = await screen.findByRole('button', { name: 'Upload and check' });
    expect(
      await screen.findByText('To upload, choose the practice and the extract file.'),
    ).toBeTruthy();
    expect(button.hasAttribute('disabled')).toBe(true);
    expect(button.getAttribute('aria-describedby')).toBe('cairn-upload-still-to-choose');
    await userEvent.upload(
      screen.getByLabelText('Extract file'),
      new File(['record_ref\nA-1\n'], 'q3.csv', { type: 'text/csv' }),
    );
    expect(screen.getByText('To upload, choose the practice.')).toBeTruthy();
    await userEvent.click(screen.getByLabelText('OV101 · Wrenfield Health Centre'));
    expect(screen.queryByText(/^To upload, choose/)).toBeNull();
    expect(screen.getByRole('button', { name: 'Upload and check' }).hasAttribute('disabled')).toBe(
      false,
    );
  });

  it('offers a regional lead closed quarters too, as the API allows late corrections', async () => {
    const practices = [
      { id: 11, code: 'OV101', name: 'Wrenfield Health Centre' },
      { id: 12, code: 'OV102', name: 'Quarrybank Surgery' },
    ];
    stubApi(regional, (path) => {
      if (path === '/api/extracts/upload-options')
        return { body: uploadOptions(practices, [q3.id, q2.id]) };
      if (path === '/api/extracts/format') return { body: format };
      if (path === '/api/practices/12/submissions') return { body: history([current]) };
      return undefined;
    });
    renderApp('/extracts/upload?practice=12');
    const quarter = (await screen.findByLabelText('Audit quarter')) as HTMLSelectElement;
    expect([...quarter.options].map((o) => o.textContent)).toEqual([
      '2026 Q3 (deadline 16 Dec 2026)',
      '2026 Q2 (closed)',
    ]);
    const practice = screen.getByLabelText('Practice') as HTMLSelectElement;
    expect([...practice.options].map((o) => o.textContent)).toContain(
      'OV102 · Quarrybank Surgery (Harnleigh Fold)',
    );
  });

  it('refuses a file over the server’s size limit before sending it', async () => {
    const fetchMock = stubApi(priya, (path) => {
      if (path === '/api/extracts/upload-options')
        return { body: uploadOptions(priya.practices, [q3.id], [q3]) };
      if (path === '/api/extracts/format')
        return { body: { ...format, limits: { maxBytes: 10, maxRows: 5000 } } };
      if (path === '/api/practices/12/submissions') return { body: history([]) };
      return undefined;
    });
    renderApp('/extracts/upload');
    await screen.findByText(/at most 10 bytes/);
    await userEvent.upload(
      screen.getByLabelText('Extract file'),
      new File(['x'.repeat(100)], 'big.csv', { type: 'text/csv' }),
    );
    expect(screen.getByText('This file is too large')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Upload and check' }).hasAttribute('disabled')).toBe(
      true,
    );
    expect(
      (fetchMock.mock.calls as unknown as [string, RequestInit | undefined][]).some(
        (c) => c[1]?.method === 'POST',
      ),
    ).toBe(false);
  });
});

describe('coverage', () => {
  const coverage: Coverage = {
    quarter: q3,
    totals: {
      practices: 3,
      current: 1,
      currentWithWaiting: 1,
      awaitingConfirmation: 1,
      none: 1,
      records: 447,
    },
    practices: [
      {
        practice: {
          id: 11,
          code: 'OV101',
          name: 'Wrenfield Health Centre',
          localityName: 'Ostre',
        },
        state: 'current',
        current: {
          submissionId: 30,
          records: 447,
          confirmedAt: '2026-11-02T10:00:00.000Z',
          confirmedBy: 'Imogen Varley',
        },
        // A new extract waiting to replace the current one.
        waiting: [
          {
            submissionId: 44,
            status: 'awaiting_confirmation',
            uploadedAt: '2026-12-01T11:00:00.000Z',
          },
        ],
        lastProblem: null,
      },
      {
        practice: {
          id: 12,
          code: 'OV102',
          name: 'Quarrybank Surgery',
          localityName: 'Harnleigh Fold',
        },
        state: 'awaiting_confirmation',
        current: null,
        waiting: [
          {
            submissionId: 41,
            status: 'awaiting_confirmation',
            uploadedAt: '2026-12-01T10:00:00.000Z',
          },
        ],
        lastProblem: null,
      },
      {
        practice: {
          id: 13,
          code: 'OV103',
          name: 'Harnleigh Old Mill Practice',
          localityName: 'Harnleigh Fold',
        },
        state: 'none',
        current: null,
        waiting: [],
        lastProblem: {
          submissionId: 39,
          status: 'rejected',
          code: 'missing_columns',
          reason: 'Required columns missing',
          uploadedAt: '2026-11-30T10:00:00.000Z',
        },
      },
    ],
  };

  it('counts practices by state and filters them', async () => {
    const fetchMock = stubApi(regional, (path) => {
      if (path === '/api/quarters') return { body: [q3, q2] };
      if (path === '/api/quarters/8/coverage') return { body: coverage };
      return undefined;
    });
    renderApp('/coverage');
    expect(await screen.findByText('OV101 · Wrenfield Health Centre')).toBeTruthy();
    expect(pathsOf(fetchMock)).toContain('/api/quarters/8/coverage');
    expect(screen.getByText('3 practices')).toBeTruthy();
    // The states add up to the practices, and say how many current ones have another waiting.
    expect(
      screen.getByText(
        '3 practices: 1 with a current submission, 1 awaiting confirmation of their first, 1 with neither.',
      ),
    ).toBeTruthy();
    expect(screen.getByText('1 with another extract waiting')).toBeTruthy();
    await userEvent.click(screen.getByRole('radio', { name: 'No submission (1)' }));
    expect(await screen.findByText('1 practice')).toBeTruthy();
    expect(screen.queryByText('OV101 · Wrenfield Health Centre')).toBeNull();
    const row = document.querySelector('tr[data-practice="OV103"]') as HTMLElement;
    expect(within(row).getByText('Rejected').closest('.bp6-tag')).toBeTruthy();
    // The reason in words; its code only as a tooltip.
    expect(within(row).queryByText('missing_columns')).toBeNull();
    expect(within(row).getByText('Required columns missing').getAttribute('title')).toBe(
      'Code: missing_columns',
    );
    // Awaiting confirmation: practices with no current submission yet (each practice counted once).
    await userEvent.click(screen.getByRole('radio', { name: 'Awaiting confirmation (1)' }));
    expect(await screen.findByText('1 practice')).toBeTruthy();
    expect(screen.queryByText('OV101 · Wrenfield Health Centre')).toBeNull();
    expect(screen.getByText('OV102 · Quarrybank Surgery')).toBeTruthy();
    await userEvent.click(screen.getByRole('radio', { name: 'Current submission (1)' }));
    const ov101 = (await screen.findByText('OV101 · Wrenfield Health Centre')).closest('tr')!;
    // Its waiting extract: one line, the link and its tag together.
    const line = within(ov101).getByRole('link', { name: 'Submission 44' }).closest('li')!;
    expect(within(line).getByText('Awaiting confirmation')).toBeTruthy();
    await userEvent.click(screen.getByRole('radio', { name: /^All/ }));
    await userEvent.type(screen.getByRole('textbox', { name: /Search practice/ }), 'quarry');
    expect(await screen.findByText('1 practice')).toBeTruthy();
    expect(screen.getByText('OV102 · Quarrybank Surgery')).toBeTruthy();
  });

  it('is not offered to a practice lead', async () => {
    stubApi(priya, () => undefined);
    renderApp('/coverage');
    expect(await screen.findByText('Not available for your role')).toBeTruthy();
  });
});

describe('home page', () => {
  const totals = {
    practices: 30,
    current: 24,
    currentWithWaiting: 2,
    awaitingConfirmation: 1,
    none: 5,
    records: 14_210,
  };
  const regionCoverage: Coverage = { quarter: q3, totals, practices: [] };

  it('shows a practice lead where each practice stands this quarter and the next step', async () => {
    stubApi(
      {
        ...priya,
        practices: [...priya.practices, { id: 14, code: 'OV104', name: 'Ashgrove Practice' }],
      },
      (path) => {
        if (path === '/api/quarters') return { body: [q3, q2] };
        if (path === '/api/practices/12/submissions')
          return { body: history([submission()], null) };
        if (path === '/api/practices/14/submissions')
          return {
            body: {
              ...history([], null),
              practice: { id: 14, code: 'OV104', name: 'Ashgrove Practice' },
            },
          };
        return undefined;
      },
    );
    renderApp('/');
    expect(await screen.findByRole('heading', { name: 'Welcome, Priya Calloway' })).toBeTruthy();
    expect(await screen.findByText('Extracts for 2026 Q3 are due by 16 Dec 2026.')).toBeTruthy();
    const practice = (code: string) =>
      document.querySelector(`section[data-practice="${code}"]`) as HTMLElement;
    await waitFor(() => expect(within(practice('OV102')).getByText('Submission 41')).toBeTruthy());
    const row = within(practice('OV102')).getByText('Submission 41').closest('tr')!;
    expect(within(row).getByText('Awaiting confirmation')).toBeTruthy();
    expect(
      within(row)
        .getByRole('link', { name: /Read the report and decide/ })
        .getAttribute('href'),
    ).toBe('/practices/12/submissions/41');
    expect(within(practice('OV102')).getByText(/1 extract waits for a decision/)).toBeTruthy();
    await waitFor(() =>
      expect(
        within(practice('OV104')).getByText(/No current submission for 2026 Q3 yet/),
      ).toBeTruthy(),
    );
    expect(
      within(practice('OV104'))
        .getByRole('link', { name: /Upload extract/ })
        .getAttribute('href'),
    ).toBe('/extracts/upload?practice=14&quarter=8');
    expect(
      within(practice('OV104'))
        .getByRole('link', { name: /All submissions/ })
        .getAttribute('href'),
    ).toBe('/practices/14/submissions');
  });

  it('offers a corrected extract once a practice has a current submission', async () => {
    const accepted = submission({
      id: 30,
      status: 'accepted',
      statusLabel: 'Accepted',
      isCurrent: true,
    });
    stubApi(priya, (path) => {
      if (path === '/api/quarters') return { body: [q3] };
      if (path === '/api/practices/12/submissions') return { body: history([accepted], 30) };
      return undefined;
    });
    renderApp('/');
    const cell = await screen.findByText('Submission 30');
    const section = cell.closest('section') as HTMLElement;
    expect(within(section).getByText(/Current submission for 2026 Q3: submission 30/)).toBeTruthy();
    expect(within(section).getByRole('link', { name: /Send a corrected extract/ })).toBeTruthy();
    expect(within(section).queryByRole('link', { name: /^Upload extract/ })).toBeNull();
  });

  it('keeps the whole picture: the current submission and every waiting extract, with their figures', async () => {
    const older = submission({
      id: 40,
      uploadedAt: '2026-12-01T09:00:00.000Z',
      counts: { ...submission().counts!, rowsRead: 12, rowsAccepted: 5, rowsRejected: 7 },
    });
    const newer = submission({ id: 41 });
    let cancelled: number[] = [];
    const fetchMock = stubApi(priya, (path, init) => {
      if (path === '/api/quarters') return { body: [q3] };
      const cancel = /^\/api\/practices\/12\/submissions\/(\d+)\/cancel$/.exec(path);
      if (cancel && init?.method === 'POST') {
        cancelled = [...cancelled, Number(cancel[1])];
        return { body: submission({ id: Number(cancel[1]), status: 'cancelled' }) };
      }
      if (path === '/api/practices/12/submissions')
        return {
          body: history(
            [newer, older, current].filter((s) => !cancelled.includes(s.id)),
            30,
          ),
        };
      return undefined;
    });
    renderApp('/');
    const section = (await screen.findAllByText('Submission 40'))[0]!.closest(
      'section',
    ) as HTMLElement;
    const rowOf = (id: number) =>
      section.querySelector(`tr[data-submission="${id}"]`) as HTMLElement;
    // The current one first, then each waiting extract, every one with its figures.
    expect(
      [...section.querySelectorAll('tbody tr')].map((r) => r.getAttribute('data-submission')),
    ).toEqual(['30', '41', '40']);
    expect(within(rowOf(30)).getByText('Current')).toBeTruthy();
    expect(within(rowOf(40)).getByText('7 of 12')).toBeTruthy();
    expect(within(section).getByText(/2 extracts wait for a decision/)).toBeTruthy();
    // A choice to make, not a button that confirms: compare first.
    expect(within(section).queryByRole('button', { name: /Confirm/ })).toBeNull();
    const compare = within(rowOf(41)).getByRole('link', { name: /Compare and decide/ });
    expect(compare.getAttribute('href')).toBe('/practices/12/submissions/41');
    // The older one is offered for cancelling.
    expect(within(section).getByText(/1 older extract for 2026 Q3 still waits/)).toBeTruthy();
    await userEvent.click(
      within(section).getByRole('button', { name: 'Cancel the older extract' }),
    );
    const alert = await screen.findByRole('alertdialog');
    expect(within(alert).getByText('Cancel submission 40?')).toBeTruthy();
    await userEvent.click(within(alert).getByRole('button', { name: 'Cancel it' }));
    await waitFor(() => expect(cancelled).toEqual([40]));
    await waitFor(() => expect(section.querySelector('tr[data-submission="40"]')).toBeNull());
    const post = (fetchMock.mock.calls as unknown as [string, RequestInit | undefined][]).find(
      (c) => c[1]?.method === 'POST',
    )!;
    expect(new Headers(post[1]?.headers).get('X-CSRF-Token')).toBe('tok');
  });

  it('gives a regional lead the quarter’s coverage at a glance, each count leading to its practices', async () => {
    stubApi(regional, (path) => {
      if (path === '/api/quarters') return { body: [q3, q2] };
      if (path === '/api/quarters/8/coverage') return { body: regionCoverage };
      if (path === '/api/extracts/upload-options')
        return { body: uploadOptions([{ id: 11, code: 'OV101', name: 'x' }], [q3.id, q2.id]) };
      return undefined;
    });
    renderApp('/');
    expect(await screen.findByRole('heading', { name: 'The region in 2026 Q3' })).toBeTruthy();
    expect(
      await screen.findByText(
        /5 of 30 practices have neither a current submission nor an extract waiting\./,
      ),
    ).toBeTruthy();
    const figures = screen.getByRole('list', { name: 'Coverage' });
    const none = within(figures).getByText('No submission').closest('a')!;
    expect(none.getAttribute('href')).toBe('/coverage?quarter=8&state=none');
    expect(within(figures).getByText('2 with another extract waiting')).toBeTruthy();
    expect(screen.getByRole('link', { name: /Open coverage/ }).getAttribute('href')).toBe(
      '/coverage?quarter=8',
    );
    expect(await screen.findByRole('link', { name: /Upload for a practice/ })).toBeTruthy();
  });

  it('shows an auditor the same coverage, read-only', async () => {
    stubApi(auditor, (path) => {
      if (path === '/api/quarters') return { body: [q3] };
      if (path === '/api/quarters/8/coverage') return { body: regionCoverage };
      return undefined;
    });
    renderApp('/');
    expect(await screen.findByText(/you cannot change anything/)).toBeTruthy();
    expect(await screen.findByRole('link', { name: /Open coverage/ })).toBeTruthy();
    expect(screen.queryByRole('link', { name: /Upload for a practice/ })).toBeNull();
    expect(screen.queryByRole('link', { name: /Users/ })).toBeNull();
  });
});
