import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from '../../../test/render';
import type { Route } from '../../../test/route-stub';
import { stubSignedIn } from '../../../test/signed-in';
import benchmark from '../../../test/fixtures/benchmark-q8.json';
import funnel from '../../../test/fixtures/funnel-q8-hba1c.json';
import ov102 from '../../../test/fixtures/results-ov102-priya.json';
import ov102Detail from '../../../test/fixtures/detail-ov102-priya.json';
import type {
  DisclosedCell,
  PeerTable,
  Report,
  ReportPractice,
  ReportRegion,
} from '../../lib/api/types';

// Report answers built from the API's own answers over the demo region (2026 Q3, trimmed to
// four practices and three measures): the benchmark, a funnel and OV102's results.
const slow = { timeout: 15_000 };
const CAUTION = /It is not clinical advice and not a decision tool/;

const everyPractice = [
  ...benchmark.practices.map((p) => p.practice),
  ...benchmark.coverage.missing,
].sort((a, b) => a.code.localeCompare(b.code));

function report(changes: Partial<Report> = {}): Report {
  return {
    id: 5,
    label: '2026 Q3 · report 2',
    sequence: 2,
    quarterId: 8,
    quarterLabel: '2026 Q3',
    measureSetId: 'cairn-default-2026.1',
    status: 'published',
    publishedAt: '2026-12-04T10:00:00.000Z',
    publishedBy: 'Imogen Varley',
    releaseNote: 'OV205 sent a corrected extract.',
    contentHash: 'ab'.repeat(32),
    submissionCount: 4,
    replacedBy: null,
    withdrawal: null,
    permalink: '/reports/5',
    practices: everyPractice,
    actions: { withdraw: true, region: true },
    ...changes,
  };
}

const shown = (value: number): DisclosedCell => ({
  value,
  display: String(value),
  suppression: 'none',
});
const hidden = (display: string, suppression: DisclosedCell['suppression']): DisclosedCell => ({
  value: null,
  display,
  suppression,
});
const practice = (code: string) => everyPractice.find((p) => p.code === code)!;

/** HbA1c recorded, as OV102's leads read it: their own row in full, the others protected. */
const peers: PeerTable = {
  measure: 'hba1c',
  split: 'all',
  rows: [
    {
      practice: practice('OV101'),
      own: false,
      met: shown(941),
      notMet: shown(172),
      n: shown(1113),
      rate: 941 / 1113,
    },
    {
      practice: practice('OV102'),
      own: true,
      met: shown(417),
      notMet: shown(30),
      n: shown(447),
      rate: 417 / 447,
    },
    {
      practice: practice('OV201'),
      own: false,
      met: hidden('< 5', 'primary'),
      notMet: hidden('withheld', 'secondary'),
      n: shown(7),
      rate: null,
    },
  ],
  met: shown(1362),
  notMet: hidden('withheld', 'secondary'),
  n: shown(1567),
  rate: null,
  withheld: true,
};

function part(r: Report): ReportPractice {
  return {
    report: r,
    practice: practice('OV102'),
    state: 'results',
    message: null,
    // As a report freezes them: the results with their detail.
    results: { ...ov102, detail: ov102Detail.detail } as unknown as ReportPractice['results'],
    peers: [peers],
    caution: 'x',
  };
}

function region(r: Report): ReportRegion {
  return {
    report: r,
    splits: [benchmark as unknown as ReportRegion['splits'][number]],
    funnels: [funnel as unknown as ReportRegion['funnels'][number]],
    trends: [],
    peerTables: [],
    caution: 'x',
  };
}

const stub = stubSignedIn;

/** Where a download button (an anchor) leads. */
const download = (text: string) => screen.getByText(text).closest('a')!.getAttribute('href');

const problem = (status: number, type: string, title: string, detail: string, extra = {}) => ({
  status,
  body: { type: `/api/problems/${type}`, title, status, detail, ...extra },
});

vi.setConfig({ testTimeout: 30_000 });

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('Reports list', () => {
  it('lists a quarter’s reports newest first: published, replaced and withdrawn with its reason', async () => {
    const second = report();
    const first = report({
      id: 4,
      label: '2026 Q3 · report 1',
      sequence: 1,
      status: 'replaced',
      permalink: '/reports/4',
      replacedBy: { id: 5, label: '2026 Q3 · report 2' },
    });
    const withdrawn = report({
      id: 3,
      label: '2026 Q2 · report 1',
      sequence: 1,
      quarterId: 7,
      quarterLabel: '2026 Q2',
      status: 'withdrawn',
      permalink: '/reports/3',
      practices: [],
      withdrawal: {
        at: '2026-11-02T09:00:00.000Z',
        by: 'Imogen Varley',
        reason: 'OV205’s extract was wrong',
      },
      actions: { withdraw: false, region: false },
    });
    stub('auditor', {
      'GET /api/reports?quarterId=8': {
        body: { reports: [second, first, withdrawn], actions: { publish: false } },
      },
    });
    renderApp('/reports?quarter=8');
    const table = (await screen.findByText('2026 Q3 · report 2', {}, slow)).closest('table')!;
    const rows = within(table).getAllByRole('row').slice(1);
    expect(
      rows.map((r) => within(r).getAllByRole('cell')[0]?.textContent ?? r.textContent),
    ).toHaveLength(3);
    expect(rows[0]!.textContent).toMatch(/2026 Q3 · report 2.*published/i);
    expect(rows[0]!.textContent).toContain('OV205 sent a corrected extract.');
    expect(rows[1]!.textContent).toMatch(/2026 Q3 · report 1.*replaced/i);
    expect(rows[2]!.textContent).toMatch(/withdrawn/i);
    expect(rows[2]!.textContent).toContain('Withdrawn: OV205’s extract was wrong');
    expect(
      within(rows[0]!)
        .getByRole('link', { name: /2026 Q3 · report 2/ })
        .getAttribute('href'),
    ).toBe('/reports/5');
    // The auditor publishes nothing.
    expect(screen.queryByRole('button', { name: /Publish report/ })).toBeNull();
  });

  it('shows a withdrawn report’s page as a tombstone: who, when and why, no figures or downloads', async () => {
    const withdrawn = report({
      status: 'withdrawn',
      practices: [],
      withdrawal: {
        at: '2026-12-04T11:00:00.000Z',
        by: 'Imogen Varley',
        reason: 'Published from the wrong quarter',
      },
      actions: { withdraw: false, region: false },
    });
    const { calls } = stub('regional_lead', { 'GET /api/reports/5': { body: withdrawn } });
    renderApp('/reports/5');
    await screen.findByText('This report was withdrawn', {}, slow);
    expect(screen.getByText(/by Imogen Varley: Published from the wrong quarter/)).toBeTruthy();
    expect(screen.queryByText(/data pack/)).toBeNull();
    expect(screen.queryByRole('button', { name: 'Withdraw' })).toBeNull();
    expect(calls.some((c) => c.path.startsWith('/api/reports/5/'))).toBe(false);
  });
});

describe('Report page', () => {
  it('shows the region’s figures and a practice’s, each with its downloads, and the caution once', async () => {
    const r = report();
    stub('regional_lead', {
      'GET /api/reports/5': { body: r },
      'GET /api/reports/5/region': { body: region(r) },
      'GET /api/reports/5/practices/1': {
        body: { ...part(r), practice: practice('OV101'), peers: [] },
      },
    });
    renderApp('/reports/5');
    await screen.findByText(
      'Everyone, 4 practices with results; 1 without a confirmed extract when published',
      {},
      slow,
    );
    const regionTable = screen.getByText(/^Everyone, 4 practices/).closest('table')!;
    const hba1c = within(regionTable)
      .getByRole('rowheader', { name: 'HbA1c recorded' })
      .closest('tr')!;
    expect(
      within(hba1c)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['87.7 %', '88.1 %', '29', expect.stringContaining('NICE NG28')]);
    expect(screen.getByText(r.contentHash)).toBeTruthy();
    expect(screen.getByText('OV205 sent a corrected extract.')).toBeTruthy();
    expect(download('Region data pack (XLSX)')).toBe('/api/reports/5/data-pack.xlsx');
    expect(download('Region report (PDF)')).toBe('/api/reports/5/report.pdf');
    await screen.findByText('OV101 data pack (XLSX)', {}, slow);
    expect(download('OV101 data pack (XLSX)')).toBe('/api/reports/5/practices/1/data-pack.xlsx');
    expect(download('OV101 report (PDF)')).toBe('/api/reports/5/practices/1/report.pdf');
    expect(screen.getAllByText(CAUTION)).toHaveLength(1);
  });

  it('shows a practice lead their own practice in full and other practices under disclosure control', async () => {
    const r = report({
      practices: [practice('OV102')],
      actions: { withdraw: false, region: false },
    });
    const { calls } = stub('practice_lead', {
      'GET /api/reports/5': { body: r },
      'GET /api/reports/5/practices/2': { body: part(r) },
    });
    renderApp('/reports/5');
    const own = await screen.findByText('417 / 447', {}, slow);
    expect(own.closest('tr')!.textContent).toContain('93.3 % (90.6 % – 95.3 %)');
    const table = screen.getByText(/Other practices under disclosure control/).closest('table')!;
    const row = (code: string) =>
      within(table)
        .getByRole('rowheader', { name: new RegExp(`^${code} `) })
        .closest('tr')!;
    const cells = (code: string) =>
      within(row(code))
        .getAllByRole('cell')
        .map((c) => c.textContent);
    expect(within(row('OV102')).getByRole('rowheader').textContent).toContain('(yours)');
    expect(cells('OV102')).toEqual(['417', '30', '447', '93.3 %']);
    expect(cells('OV201')).toEqual(['< 5', 'withheld', '7', 'withheld']);
    expect(
      within(table).getByRole('rowheader', { name: 'Region' }).closest('tr')!.textContent,
    ).toContain('withheld');
    expect(screen.queryByText('Region data pack (XLSX)')).toBeNull();
    expect(download('OV102 data pack (XLSX)')).toBe('/api/reports/5/practices/2/data-pack.xlsx');
    expect(screen.queryByRole('button', { name: 'Withdraw' })).toBeNull();
    expect(calls.some((c) => c.path === '/api/reports/5/region')).toBe(false);
    expect(screen.getAllByText(CAUTION)).toHaveLength(1);
  });
});

describe('Withdraw dialog', () => {
  it('shows the API’s refusal of a blank reason next to the field, and any other refusal in the dialog', async () => {
    const r = report({ practices: [] });
    let answer: Route = problem(400, 'validation-failed', 'The reason is empty', 'Say why.', {
      errors: [{ field: 'reason', message: 'must not be blank' }],
    });
    const { calls } = stub('regional_lead', {
      'GET /api/reports/5': { body: r },
      'GET /api/reports/5/region': { body: region(r) },
      'POST /api/reports/5/withdraw': (body) =>
        typeof answer === 'function' ? answer(body) : answer,
    });
    const user = userEvent.setup();
    renderApp('/reports/5');
    await user.click(await screen.findByRole('button', { name: 'Withdraw' }, slow));
    const dialog = await screen.findByRole('dialog');
    await user.click(within(dialog).getByRole('button', { name: 'Withdraw report' }));
    expect(await within(dialog).findByText('Must not be blank.')).toBeTruthy();
    answer = problem(
      409,
      'report-withdrawn',
      'Already withdrawn',
      'Withdrawn earlier by Imogen Varley.',
    );
    await user.type(within(dialog).getByLabelText(/Reason/), 'Wrong quarter');
    await user.click(within(dialog).getByRole('button', { name: 'Withdraw report' }));
    expect(await within(dialog).findByText('Already withdrawn')).toBeTruthy();
    expect(within(dialog).getByText('Withdrawn earlier by Imogen Varley.')).toBeTruthy();
    expect(calls.filter((c) => c.method === 'POST').map((c) => c.body)).toEqual([
      { reason: '' },
      { reason: 'Wrong quarter' },
    ]);
  });
});

describe('Publishing from the benchmark page', () => {
  const benchmarkRoutes = (publish: boolean): Record<string, Route> => ({
    'GET /api/quarters/8/benchmark?split=all': { body: benchmark },
    'GET /api/quarters/8/benchmark/measures/hba1c?split=all': { body: funnel },
    'GET /api/reports?quarterId=8': { body: { reports: [report()], actions: { publish } } },
  });

  it('is not offered to the auditor', async () => {
    const { fetchMock } = stub('auditor', benchmarkRoutes(false));
    renderApp('/benchmark?quarter=8');
    await screen.findAllByRole('button', { name: /^OV102 / }, slow);
    await waitFor(() =>
      expect(
        fetchMock.mock.results.some(
          (r, i) =>
            String(fetchMock.mock.calls[i]![0]).includes('/api/reports?quarterId=8') &&
            r.type === 'return',
        ),
      ).toBe(true),
    );
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(screen.queryByText(/Publish report/)).toBeNull();
  });

  it('refuses a blank release note next to the field, shows the API’s refusal, then opens the new report', async () => {
    const published = report({
      id: 6,
      label: '2026 Q3 · report 3',
      sequence: 3,
      permalink: '/reports/6',
    });
    let answer: Route = problem(
      409,
      'benchmark-changed',
      'The benchmark changed while publishing',
      'An extract for 2026 Q3 was confirmed while the report was being frozen.',
    );
    const { calls } = stub('regional_lead', {
      ...benchmarkRoutes(true),
      'POST /api/quarters/8/reports': (body) =>
        typeof answer === 'function' ? answer(body) : answer,
      'GET /api/reports/6': { body: published },
      'GET /api/reports/6/region': { body: region(published) },
      'GET /api/reports/6/practices/1': {
        body: { ...part(published), practice: practice('OV101') },
      },
    });
    const user = userEvent.setup();
    renderApp('/benchmark?quarter=8');
    await user.click(await screen.findByRole('button', { name: 'Publish report…' }, slow));
    const dialog = await screen.findByRole('dialog', { name: /Publish 2026 Q3/ });
    expect(within(dialog).getByText(/2026 Q3 · report 2 stays readable/)).toBeTruthy();
    await user.click(within(dialog).getByRole('button', { name: 'Publish report' }));
    expect(
      within(dialog).getByText('Write a release note: what readers of this report should know.'),
    ).toBeTruthy();
    expect(
      within(dialog)
        .getByLabelText(/Release note/)
        .getAttribute('aria-invalid'),
    ).toBe('true');
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await user.type(within(dialog).getByLabelText(/Release note/), 'Third report of the quarter.');
    expect(
      within(dialog).queryByText('Write a release note: what readers of this report should know.'),
    ).toBeNull();
    await user.click(within(dialog).getByRole('button', { name: 'Publish report' }));
    expect(await within(dialog).findByText('The benchmark changed while publishing')).toBeTruthy();

    answer = { status: 201, body: published };
    await user.click(within(dialog).getByRole('button', { name: 'Publish report' }));
    expect(await screen.findByText('2026 Q3 · report 3', {}, slow)).toBeTruthy();
    expect(calls.filter((c) => c.method === 'POST').map((c) => [c.path, c.body])).toEqual([
      ['/api/quarters/8/reports', { releaseNote: 'Third report of the quarter.' }],
      ['/api/quarters/8/reports', { releaseNote: 'Third report of the quarter.' }],
    ]);
  });
});
