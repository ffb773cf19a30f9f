import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from '../../../test/render';
import { type Route, stubRoutes } from '../../../test/route-stub';
import outliers from '../../../test/fixtures/review/outliers-q2.json';
import drill from '../../../test/fixtures/review/drill-ov102.json';
import records from '../../../test/fixtures/review/records-ov102.json';
import caseAuditor from '../../../test/fixtures/review/case-caseAuditor.json';
import caseLead from '../../../test/fixtures/review/case-caseLead.json';
import casesAuditor from '../../../test/fixtures/review/case-casesAuditor.json';
import casesLead from '../../../test/fixtures/review/case-casesLead.json';
import reopenedLead from '../../../test/fixtures/review/case-reopenedLead.json';
import reopenedAuditor from '../../../test/fixtures/review/case-reopenedAuditor.json';
import type { Me } from '../../lib/api/types';
import { about } from '../../../test/signed-in';

// Fixtures: the API's own answers over the demo organisation's practices in an API test world
// (two practices with extracts in 2026 Q3, quarter id 2), trimmed; the outlier list has one row
// added (worse, a case open on it) so that both sides and the marker show.
const person = (role: Me['role'], displayName: string, practices: Me['practices']): Me => ({
  id: 3,
  email: 'someone@x.example',
  displayName,
  role,
  regionName: 'Ostrevale',
  practices,
  sessionExpiresAt: '2026-12-05T06:57:32.717Z',
});
const tobias = person('auditor', 'Tobias Renwick', []);
const imogen = person('regional_lead', 'Imogen Varley', []);
const priya = person('practice_lead', 'Priya Calloway', [
  { id: 2, code: 'OV102', name: 'Quarrybank Surgery' },
]);

const LIST = '/api/quarters/2/outliers';
const DRILL = '/api/quarters/2/outliers/practices/2/measures/hba1c';

function stub(me: Me, extra: Record<string, Route> = {}) {
  return stubRoutes({
    'GET /api/about': { body: about },
    'GET /api/session': { body: { user: me, csrfToken: 'tok' } },
    'GET /api/quarters': { body: [drill.quarter] },
    [`GET ${LIST}?level=outer&caseMix=false`]: { body: outliers },
    [`GET ${LIST}?level=inner&caseMix=false`]: { body: outliers },
    [`GET ${LIST}?level=inner&caseMix=true`]: { body: outliers },
    [`GET ${LIST}?level=inner&caseMix=true&measure=hba1c`]: { body: outliers },
    [`GET ${DRILL}?split=all`]: { body: drill },
    [`GET ${DRILL}/records?page=1&pageSize=25`]: { body: { ...records, total: 30, pageSize: 25 } },
    [`GET ${DRILL}/records?page=2&pageSize=25`]: {
      body: { ...records, total: 30, page: 2, pageSize: 25, records: records.records.slice(0, 2) },
    },
    'GET /api/review-cases': { body: me.role === 'practice_lead' ? casesLead : casesAuditor },
    'GET /api/review-cases/1': { body: me.role === 'practice_lead' ? caseLead : caseAuditor },
    ...extra,
  });
}

// The first render loads the page's lazy chunk: allow it time.
const slow = { timeout: 15_000 };
vi.setConfig({ testTimeout: 30_000 });

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('Outlier list', () => {
  it('lists worse and better apart, with the reason in words and the open case marked', async () => {
    stub(tobias);
    renderApp('/outliers?quarter=2');
    const worse = await screen.findByRole('heading', { name: 'Worse than expected (1)' }, slow);
    const better = screen.getByRole('heading', { name: 'Better than expected (2)' });
    const worseTable = within(worse.closest('section')!);
    const betterTable = within(better.closest('section')!);
    const ov102 = worseTable.getByRole('row', { name: /OV102 Quarrybank Surgery/ });
    expect(within(ov102).getByText(/Below the 95 % lower limit of 53\.8 %/)).toBeTruthy();
    expect(within(ov102).getByText('3 quarters in a row')).toBeTruthy();
    expect(within(ov102).getByRole('link', { name: 'Case 1' }).getAttribute('href')).toBe(
      '/review-cases/1',
    );
    expect(within(ov102).queryByRole('button', { name: 'Open case' })).toBeNull();
    expect(
      betterTable.getAllByRole('row', { name: /OV201 Cindermere Lakeside Surgery/ }),
    ).toHaveLength(2);
    expect(betterTable.getAllByText(/Better than expected: a higher rate is better/)).toHaveLength(
      2,
    );
    expect(betterTable.getAllByRole('button', { name: 'Open case' })).toHaveLength(2);
    expect(screen.getAllByText(/not clinical advice/).length).toBeGreaterThan(0);
  });

  it('asks again for each filter: limits, case mix, measure', async () => {
    const { calls } = stub(tobias);
    const user = userEvent.setup();
    renderApp('/outliers?quarter=2');
    await screen.findByRole('heading', { name: 'Worse than expected (1)' }, slow);
    await user.selectOptions(screen.getByRole('combobox', { name: /^Limits/ }), 'inner');
    await waitFor(() =>
      expect(calls.map((c) => c.path)).toContain(`${LIST}?level=inner&caseMix=false`),
    );
    await user.click(screen.getByLabelText('Adjust for case mix'));
    await waitFor(() =>
      expect(calls.map((c) => c.path)).toContain(`${LIST}?level=inner&caseMix=true`),
    );
    await user.selectOptions(screen.getByRole('combobox', { name: /^Measure/ }), 'hba1c');
    await waitFor(() =>
      expect(calls.map((c) => c.path)).toContain(`${LIST}?level=inner&caseMix=true&measure=hba1c`),
    );
  });

  it('says when nothing stands out, and when the quarter has nothing to judge', async () => {
    stub(imogen, {
      [`GET ${LIST}?level=outer&caseMix=false`]: {
        body: { ...outliers, rows: [], mayOpenCases: false },
      },
    });
    renderApp('/outliers?quarter=2');
    await screen.findByRole('heading', { name: 'Worse than expected (0)' }, slow);
    expect(screen.getByRole('heading', { name: 'Better than expected (0)' })).toBeTruthy();
    expect(screen.getAllByText('None.')).toHaveLength(2);
    vi.unstubAllGlobals();
    stub(imogen, {
      [`GET ${LIST}?level=outer&caseMix=false`]: {
        body: {
          ...outliers,
          state: 'no-accepted-submissions',
          basis: null,
          rows: [],
          practices: 0,
        },
      },
    });
    renderApp('/outliers?quarter=2');
    await screen.findByText('Nothing to judge yet', undefined, slow);
    expect(screen.getByText('2026 Q3 has no accepted submissions.')).toBeTruthy();
  });

  it('offers no case to a regional lead, who may not open one', async () => {
    stub(imogen, {
      [`GET ${LIST}?level=outer&caseMix=false`]: { body: { ...outliers, mayOpenCases: false } },
    });
    renderApp('/outliers?quarter=2');
    await screen.findByRole('heading', { name: 'Better than expected (2)' }, slow);
    expect(screen.queryByRole('button', { name: 'Open case' })).toBeNull();
    expect(screen.getAllByText('none')).toHaveLength(2);
  });
});

describe('Drill-down', () => {
  it('gives every chart a table alternative', async () => {
    stub(tobias);
    const user = userEvent.setup();
    renderApp('/outliers/2/practices/2/measures/hba1c');
    await screen.findByRole('heading', { name: /OV102 Quarrybank Surgery: HbA1c recorded/ }, slow);
    const figures = screen.getAllByRole('figure');
    // By diabetes type, four breakdowns, the histogram and the trend.
    expect(figures).toHaveLength(1 + drill.breakdowns.length + 1 + 1);
    for (const figure of figures) {
      expect(within(figure).queryByRole('table')).toBeNull();
      await user.click(within(figure).getByRole('button', { name: 'Show as table' }));
      expect(within(figure).getByRole('table')).toBeTruthy();
      expect(within(figure).getByRole('button', { name: 'Show as chart' })).toBeTruthy();
    }
    const byType = within(figures[0]!).getByRole('table');
    expect(within(byType).getByRole('rowheader', { name: 'All types' })).toBeTruthy();
    expect(within(byType).getByText(/\(12 of 12\)/)).toBeTruthy();
  });

  it('draws the values as the results page does, with the same table', async () => {
    stub(tobias);
    const user = userEvent.setup();
    renderApp('/outliers/2/practices/2/measures/hba1c');
    const heading = await screen.findByRole(
      'heading',
      { name: /HbA1c \(mmol\/mol\): the practice’s values/ },
      slow,
    );
    const section = within(heading.closest('section')!);
    expect(
      section.getByRole('img', { name: /OV102 as bars, the region as a dashed outline/ }),
    ).toBeTruthy();
    await user.click(section.getByRole('button', { name: 'Show as table' }));
    const table = section.getByRole('table', { name: 'HbA1c: figures' });
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((c) => c.textContent),
    ).toEqual(['HbA1c', 'OV102', 'Share', 'Region', 'Share']);
    expect(within(table).getByRole('rowheader', { name: 'Not recorded' })).toBeTruthy();
  });

  it('pages the records behind the result and links the evidence workbook', async () => {
    const { calls } = stub(tobias);
    const user = userEvent.setup();
    renderApp('/outliers/2/practices/2/measures/hba1c');
    await screen.findByText('Records 1–25 of 30', undefined, slow);
    const section = within(
      screen.getByRole('heading', { name: 'The records behind it' }).closest('section')!,
    );
    expect(section.getByRole('rowheader', { name: records.records[0]!.pseudonym })).toBeTruthy();
    expect(section.getByText('Page 1 of 2')).toBeTruthy();
    expect(
      (section.getByRole('button', { name: /Previous 25/ }) as HTMLButtonElement).disabled,
    ).toBe(true);
    await user.click(section.getByRole('button', { name: /Next 25/ }));
    await screen.findByText('Records 26–30 of 30');
    expect(calls.map((c) => c.path)).toContain(`${DRILL}/records?page=2&pageSize=25`);
    expect((section.getByRole('button', { name: /Next 25/ }) as HTMLButtonElement).disabled).toBe(
      true,
    );
    const link = screen.getByRole('link', { name: /Download the evidence/ });
    expect(link.getAttribute('href')).toBe(`${DRILL}/evidence.xlsx`);
  });
});

describe('Review cases', () => {
  it('lists the cases the reader may see, and says when there are none', async () => {
    stub(tobias);
    renderApp('/review-cases');
    const row = await screen.findByRole('row', { name: /Case 1/ }, slow);
    expect(within(row).getByText(/OV102 Quarrybank Surgery/)).toBeTruthy();
    expect(within(row).getByText('HbA1c recorded')).toBeTruthy();
    expect(within(row).getByText(casesAuditor.cases[0]!.statusLabel)).toBeTruthy();
    vi.unstubAllGlobals();
    stub(priya, { 'GET /api/review-cases': { body: { ...casesLead, cases: [] } } });
    renderApp('/review-cases');
    await screen.findByText(
      /When the audit team asks your practice about a result/,
      undefined,
      slow,
    );
  });

  it('shows the timeline in order with who and when; the auditor sees internal notes', async () => {
    stub(tobias);
    renderApp('/review-cases/1');
    await screen.findByRole('heading', { name: /Review case 1: OV102/ }, slow);
    const timeline = screen.getByRole('heading', { name: 'Timeline' }).closest('section')!;
    const heads = [...timeline.querySelectorAll('ol > li')].map(
      (li) => li.querySelector('.cairn-timeline-head')!.textContent,
    );
    expect(heads).toHaveLength(caseAuditor.timeline.length);
    expect(heads[0]).toMatch(/^Tobias Renwick \(Auditor\) opened the case/);
    expect(heads[1]).toMatch(/^Tobias Renwick \(Auditor\) asked/);
    expect(heads[2]).toMatch(/^Priya Calloway \(Practice lead\) answered/);
    expect(heads[3]).toMatch(/^Tobias Renwick \(Auditor\) wrote an internal note/);
    const times = [...timeline.querySelectorAll('time')].map((t) => t.getAttribute('dateTime'));
    expect(times).toEqual(caseAuditor.timeline.map((e) => e.at));
    expect(within(timeline).getAllByText('internal: the practice does not see this')).toHaveLength(
      2,
    );
    expect(within(timeline).getByRole('link', { name: 'coding-check.pdf' })).toBeTruthy();
  });

  it('never shows a practice lead an internal note, and shows only the actions the API allows', async () => {
    stub(priya);
    renderApp('/review-cases/1');
    await screen.findByRole('heading', { name: /Review case 1: OV102/ }, slow);
    expect(screen.queryByText(/internal/i)).toBeNull();
    expect(screen.queryByText('Answer looks plausible; compare next quarter.')).toBeNull();
    expect(screen.getByRole('button', { name: 'Send the answer' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Close the case' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Send the question' })).toBeNull();
    expect(screen.queryByRole('combobox', { name: 'Who sees it' })).toBeNull();
  });

  it('shows the auditor the actions the API allows, and no answer form', async () => {
    stub(tobias);
    renderApp('/review-cases/1');
    await screen.findByRole('heading', { name: /Review case 1: OV102/ }, slow);
    expect(screen.getByRole('button', { name: 'Send the question' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Close the case' })).toBeTruthy();
    expect(screen.getByRole('combobox', { name: 'Who sees it' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Send the answer' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Reopen' })).toBeNull();
  });

  it('says what is wrong with an answer before sending it: text, file type, file size', async () => {
    const { calls } = stub(priya);
    const user = userEvent.setup({ applyAccept: false });
    renderApp('/review-cases/1');
    const send = await screen.findByRole('button', { name: 'Send the answer' }, slow);
    await user.click(send);
    expect(await screen.findByText('Write your answer before sending it.')).toBeTruthy();
    await user.type(screen.getByLabelText('Your answer'), 'Coding fixed.');
    const big = new File(['x'], 'audit.pdf', { type: 'application/pdf' });
    Object.defineProperty(big, 'size', { value: 11 * 1024 * 1024 });
    const wrong = new File(['MZ'], 'tool.exe', { type: 'application/octet-stream' });
    await user.upload(screen.getByLabelText('Attachments (optional)'), [big, wrong]);
    await user.click(send);
    expect(
      await screen.findByText('“audit.pdf” is 11.0 MB; each file may be at most 10 MB.'),
    ).toBeTruthy();
    expect(screen.getByText('“tool.exe” is not a PDF, XLSX, CSV, PNG or JPEG file.')).toBeTruthy();
    expect(screen.queryByText('Write your answer before sending it.')).toBeNull();
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
  });

  it('explains a 409 when the case changed meanwhile', async () => {
    const { calls } = stub(tobias, {
      'POST /api/review-cases/1/transitions': {
        status: 409,
        body: {
          type: '/api/problems/case-changed',
          title: 'The review case has changed',
          status: 409,
          detail:
            'Someone changed this review case after you opened it. It is shown as it is now; nothing was stored.',
          case: caseAuditor,
        },
      },
    });
    const user = userEvent.setup();
    renderApp('/review-cases/1');
    await screen.findByRole('heading', { name: /Review case 1: OV102/ }, slow);
    await screen.findByRole('option', { name: 'No concern' });
    await user.selectOptions(screen.getByRole('combobox', { name: 'Finding' }), 'no_concern');
    await user.click(screen.getByRole('button', { name: 'Close the case' }));
    expect(await screen.findByText('The review case has changed')).toBeTruthy();
    expect(screen.getByText(/Someone changed this review case after you opened it/)).toBeTruthy();
    expect(calls.find((c) => c.method === 'POST')?.body).toMatchObject({
      action: 'close',
      expectedVersion: caseAuditor.version,
      finding: 'no_concern',
    });
  });

  it('shows a reopened case’s last finding and who reopened it, to the practice lead and the auditor', async () => {
    for (const [me, body] of [
      [priya, reopenedLead],
      [tobias, reopenedAuditor],
    ] as const) {
      stub(me, { 'GET /api/review-cases/1': { body } });
      const view = renderApp('/review-cases/1');
      const notice = (await screen.findByText('Reopened', undefined, slow)).closest(
        '.cairn-review-reopened',
      ) as HTMLElement;
      expect(notice.textContent).toMatch(/^ReopenedTobias Renwick reopened this case on /);
      expect(within(notice).getByText('“Data quality issue”')).toBeTruthy();
      expect([...notice.querySelectorAll('time')].map((t) => t.getAttribute('dateTime'))).toEqual([
        body.reopened!.at,
        body.reopened!.previousClosedAt,
      ]);
      view.unmount();
      vi.unstubAllGlobals();
    }
    stub(priya, { 'GET /api/review-cases': { body: { ...casesLead, cases: [reopenedLead] } } });
    renderApp('/review-cases');
    const row = await screen.findByRole('row', { name: /Case 1/ }, slow);
    expect(within(row).getByText(/reopened .*; last finding “Data quality issue”/)).toBeTruthy();
  });
});
