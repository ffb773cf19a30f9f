import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from '../../../test/render';
import { stubRoutes } from '../../../test/route-stub';
import quarters from '../../../test/fixtures/quarters.json';
import ov102 from '../../../test/fixtures/results-ov102-priya.json';
import ov102Detail from '../../../test/fixtures/detail-ov102-priya.json';
import ov303 from '../../../test/fixtures/results-ov303-none.json';
import recall from '../../../test/fixtures/recall-ov102-hba1c.json';
import type { Me } from '../../lib/api/types';
import { about } from '../../../test/signed-in';

// Fixtures: answers of the API over the demo region (2026 Q3), trimmed to three measures.
const person = (role: Me['role'], practices: Me['practices']): Me => ({
  id: 3,
  email: 'someone@x.example',
  displayName: 'Someone',
  role,
  regionName: 'Ostrevale',
  practices,
  sessionExpiresAt: '2026-12-05T06:57:32.717Z',
});
const priya = person('practice_lead', [{ id: 2, code: 'OV102', name: 'Quarrybank Surgery' }]);
const daniel = person('practice_lead', [
  { id: 1, code: 'OV101', name: 'Wrenfield Health Centre' },
  { id: 2, code: 'OV102', name: 'Quarrybank Surgery' },
]);
const imogen = person('regional_lead', []);

function stub(me: Me, extra: Record<string, { status?: number; body: unknown }> = {}) {
  return stubRoutes({
    'GET /api/about': { body: about },
    'GET /api/session': { body: { user: me, csrfToken: 'tok' } },
    'GET /api/quarters': { body: quarters },
    'GET /api/practices/2/quarters/8/results': { body: ov102 },
    'GET /api/practices/2/quarters/8/results/detail': { body: ov102Detail },
    'GET /api/practices/18/quarters/8/results': { body: ov303 },
    'GET /api/practices/2/quarters/8/recall-list?measure=hba1c&split=all&offset=0&limit=50': {
      body: recall,
    },
    ...extra,
  });
}

const detailPath = '/api/practices/2/quarters/8/results/detail';

// The first render loads the page's lazy chunk: allow it time.
const slow = { timeout: 15_000 };

// Each page test loads lazy chunks and renders a large table: more than the default 5 s.
vi.setConfig({ testTimeout: 30_000 });

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('Practice results', () => {
  it('sends a practice lead from /results to their practice', async () => {
    stub(priya);
    renderApp('/results');
    await screen.findByRole('heading', { name: 'Quarrybank Surgery (OV102)' }, slow);
  });

  it('shows every measure with rate, interval, flag in words, change, trend signal and improvement', async () => {
    stub(priya);
    renderApp('/practices/2/results');
    await screen.findByRole('heading', { name: 'Quarrybank Surgery (OV102)' }, slow);
    expect(screen.getAllByText(/not clinical advice/).length).toBeGreaterThan(0);
    expect(screen.getByText(/counts from 1 to 4 show as “< 5”/)).toBeTruthy();
    const row = screen.getByRole('row', { name: /HbA1c recorded/ });
    const cells = within(row);
    expect(cells.getByText('93.3 %')).toBeTruthy();
    expect(cells.getByText('417 of 447')).toBeTruthy();
    expect(cells.getByText('Outlier, better')).toBeTruthy();
    expect(cells.getByText('+8.9 points since 2026 Q2 (better)')).toBeTruthy();
    expect(
      cells.getByText(/^Trend upward: 7 points in a row rising, 2025 Q1 to 2026 Q3$/),
    ).toBeTruthy();
    expect(cells.getByText('At or beyond the region median (88.1 %).')).toBeTruthy();
    expect(cells.getByText(/^Guideline: NICE NG28/)).toBeTruthy();
    expect(
      cells.getByRole('img', { name: /^93\.3 % \(95 % interval .* region median 88\.1 %$/ }),
    ).toBeTruthy();
    expect(screen.getByRole('heading', { name: 'Treatment targets' })).toBeTruthy();
  });

  it('shows the charts as tables on request', async () => {
    stub(priya);
    renderApp('/practices/2/results');
    await screen.findByRole('heading', { name: 'Quarrybank Surgery (OV102)' }, slow);
    await userEvent.click(screen.getByLabelText('Show charts as tables'));
    const row = screen.getByRole('row', { name: /HbA1c recorded/ });
    expect(within(row).queryByRole('img')).toBeNull();
    expect(within(row).getByText(/^2026 Q3: 93\.3 %$/)).toBeTruthy();
  });

  it('draws time to insulin against the region with the rule of thumb labelled', async () => {
    stub(priya);
    renderApp('/practices/2/results?tab=insulin');
    await screen.findByText('Rule of thumb: about 7 years', {}, slow);
    expect(screen.getByText(/common practice, no single source/)).toBeTruthy();
    await userEvent.click(screen.getByLabelText('Show time to insulin as a table'));
    expect(screen.getByRole('columnheader', { name: 'Region: not yet on insulin' })).toBeTruthy();
  });

  it('shows the kidney grid with the KDIGO risk in words', async () => {
    stub(priya);
    renderApp('/practices/2/results?tab=kidney');
    const grid = await screen.findByRole('table', {}, slow);
    expect(within(grid).getByRole('rowheader', { name: 'G3a' })).toBeTruthy();
    expect(within(grid).getAllByText('Very high risk').length).toBeGreaterThan(0);
    expect(within(grid).getByRole('rowheader', { name: 'No creatinine recorded' })).toBeTruthy();
  });

  it('lists the recall list with its downloads', async () => {
    stub(priya);
    renderApp('/practices/2/results?tab=recall');
    await screen.findByRole('table', { name: 'Recall list' }, slow);
    expect(screen.getByText(recall.items[0]!.reference)).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Download CSV' }).getAttribute('href')).toBe(
      '/api/practices/2/quarters/8/recall-list.csv?measure=hba1c&split=all',
    );
    expect(screen.getByRole('link', { name: 'Download XLSX' }).getAttribute('href')).toBe(
      '/api/practices/2/quarters/8/recall-list.xlsx?measure=hba1c&split=all',
    );
  });

  it('says so when the practice has no current submission, and links to upload', async () => {
    stub(imogen);
    renderApp('/practices/18/results');
    await screen.findByRole('heading', { name: 'No current submission for 2026 Q3' }, slow);
    expect(screen.getByText(/has no confirmed extract for 2026 Q3/)).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Upload an extract' }).getAttribute('href')).toBe(
      '/extracts/upload?practice=18&quarter=8',
    );
    expect(screen.queryByRole('row', { name: /HbA1c/ })).toBeNull();
  });

  it('lets a lead of several practices switch practice in place', async () => {
    const { calls } = stub(daniel, {
      'GET /api/practices/1/quarters/8/results': {
        body: { ...ov303, practice: daniel.practices[0], message: 'None yet.' },
      },
    });
    renderApp('/practices/2/results');
    await screen.findByRole('heading', { name: 'Quarrybank Surgery (OV102)' }, slow);
    await userEvent.selectOptions(screen.getByLabelText('Practice'), '1');
    await screen.findByRole('heading', { name: 'No current submission for 2026 Q3' }, slow);
    expect(calls.some((c) => c.path === '/api/practices/1/quarters/8/results')).toBe(true);
  });

  it('shows the problem when the API refuses', async () => {
    stub(priya, {
      'GET /api/practices/9/quarters/8/results': {
        status: 403,
        body: {
          type: '/problems/practice-not-yours',
          title: 'Not your practice',
          status: 403,
          detail: 'You are not a lead of OV201.',
        },
      },
    });
    renderApp('/practices/9/results');
    await screen.findByText('You are not a lead of OV201.', {}, slow);
    await waitFor(() => expect(screen.queryByRole('tab')).toBeNull());
  });
  it('places the practice among its unnamed peers, with the flag as a shape and in words', async () => {
    stub(priya);
    renderApp('/practices/2/results?tab=peers');
    await screen.findByRole('heading', { name: 'Care processes' }, slow);
    const row = screen.getByRole('row', { name: /HbA1c recorded/ });
    const hba1c = ov102.measures.find((m) => m.measure.key === 'hba1c')!.splits[0]!;
    expect(
      within(row).getByText(
        new RegExp(
          `^OV102 93\\.3 % \\(outlier, better\\): of ${hba1c.peers.rate.length} other practices shown`,
        ),
      ),
    ).toBeTruthy();
    expect(within(row).getByRole('img').getAttribute('aria-label')).toMatch(/^HbA1c recorded: /);
    // As tables: the words stay, the drawing goes.
    await userEvent.click(screen.getByLabelText('Show charts as tables'));
    expect(
      within(screen.getByRole('row', { name: /HbA1c recorded/ })).queryByRole('img'),
    ).toBeNull();
  });

  it('shows each recorded value’s spread against the region, with a table alternative', async () => {
    stub(priya);
    renderApp('/practices/2/results?tab=values');
    const first = ov102Detail.detail.values[0]!;
    await screen.findByRole('heading', { name: `${first.label} (${first.unit})` }, slow);
    expect(
      screen.getAllByRole('img', { name: new RegExp(`^${first.label}: share of recorded values`) })
        .length,
    ).toBeGreaterThan(0);
    await userEvent.click(screen.getByLabelText(`Show ${first.label} as a table`));
    const table = screen.getByRole('table', { name: `${first.label}: figures` });
    expect(within(table).getByRole('rowheader', { name: 'Not recorded' })).toBeTruthy();
  });

  it('lands a practice lead on their results after sign-in once there is a current submission, reading the quarter list once', async () => {
    const { calls } = stub(priya, {
      'GET /api/practices/2/submissions': {
        body: {
          practice: priya.practices[0],
          quarters: [{ quarter: quarters[0], currentSubmissionId: 340, submissions: [] }],
        },
      },
    });
    renderApp('/start');
    await screen.findByRole('heading', { name: 'Quarrybank Surgery (OV102)' }, slow);
    await screen.findByRole('row', { name: /HbA1c recorded/ }, slow);
    // The landing and the results page share one quarter list (lib/quarter-list.ts).
    expect(calls.filter((c) => c.method === 'GET' && c.path === '/api/quarters')).toHaveLength(1);
  });

  it('lands a practice lead without a current submission on the home page', async () => {
    stub(priya, {
      'GET /api/practices/2/submissions': {
        body: {
          practice: priya.practices[0],
          quarters: [
            {
              quarter: quarters[0],
              currentSubmissionId: null,
              submissions: [],
              actions: { upload: true },
            },
          ],
        },
      },
    });
    renderApp('/start');
    await screen.findByRole('heading', { name: 'Welcome, Someone' }, slow);
  });

  it('sends a lead of several practices from /results to the first by code', async () => {
    stub(daniel, {
      'GET /api/practices/1/quarters/8/results': {
        body: { ...ov303, practice: daniel.practices[0], message: 'None yet.' },
      },
    });
    renderApp('/results');
    await screen.findByRole('heading', { name: 'Wrenfield Health Centre (OV101)' }, slow);
  });

  describe('the detail (its own request)', () => {
    it('is not read on the measures tab, and is read once a tab that shows it opens', async () => {
      const { calls } = stub(priya);
      renderApp('/practices/2/results');
      await screen.findByRole('heading', { name: 'Care processes' }, slow);
      await userEvent.click(screen.getByRole('tab', { name: 'Among peers' }));
      await userEvent.click(screen.getByRole('tab', { name: /^Data quality/ }));
      expect(calls.some((c) => c.path === detailPath)).toBe(false);
      await userEvent.click(screen.getByRole('tab', { name: 'Kidney risk' }));
      const grid = await screen.findByRole('table', {}, slow);
      expect(within(grid).getByRole('rowheader', { name: 'G3a' })).toBeTruthy();
      expect(calls.filter((c) => c.path === detailPath)).toHaveLength(1);
      // Another tab of the detail shows the same answer.
      await userEvent.click(screen.getByRole('tab', { name: 'Breakdowns' }));
      await screen.findByRole('heading', { name: 'Age band' }, slow);
      expect(calls.filter((c) => c.path === detailPath)).toHaveLength(1);
    });

    it('shows a loading state until the detail arrives', async () => {
      const { fetchMock } = stub(priya);
      const answer = fetchMock.getMockImplementation()!;
      let release: () => void = () => undefined;
      const held = new Promise<void>((resolve) => (release = resolve));
      vi.stubGlobal('fetch', async (input: RequestInfo | URL, init?: RequestInit) => {
        if (String(input).endsWith('/results/detail')) await held;
        return answer(input, init);
      });
      renderApp('/practices/2/results?tab=insulin');
      await screen.findByRole('progressbar', { name: "Reading the practice's detail" }, slow);
      expect(screen.queryByText('Rule of thumb: about 7 years')).toBeNull();
      release();
      await screen.findByText('Rule of thumb: about 7 years', {}, slow);
      expect(
        screen.queryByRole('progressbar', { name: "Reading the practice's detail" }),
      ).toBeNull();
    });

    it('shows the problem when the detail cannot be read, and the other tabs still work', async () => {
      stub(priya, {
        [`GET ${detailPath}`]: {
          status: 503,
          body: {
            type: '/api/problems/database-unavailable',
            title: 'The database is not answering',
            status: 503,
            detail: 'Try again in a minute.',
          },
        },
      });
      renderApp('/practices/2/results?tab=values');
      await screen.findByText('Try again in a minute.', {}, slow);
      await userEvent.click(screen.getByRole('tab', { name: 'Measures' }));
      expect(screen.getByRole('row', { name: /HbA1c recorded/ })).toBeTruthy();
    });

    it('shows no figures of a detail built from another result than the page’s results', async () => {
      const { calls } = stub(priya, {
        [`GET ${detailPath}`]: {
          body: { ...ov102Detail, builtFrom: { ...ov102Detail.builtFrom, resultId: 2 } },
        },
      });
      renderApp('/practices/2/results?tab=kidney');
      await screen.findByText('The results have changed', {}, slow);
      expect(screen.queryByRole('rowheader', { name: 'G3a' })).toBeNull();
      const before = calls.filter((c) => c.path === detailPath).length;
      await userEvent.click(screen.getByRole('button', { name: 'Read the results again' }));
      await waitFor(() =>
        expect(calls.filter((c) => c.path === detailPath).length).toBeGreaterThan(before),
      );
    });
  });
});
