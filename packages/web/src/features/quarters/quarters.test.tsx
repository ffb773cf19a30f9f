import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from '../../../test/render';
import { stubRoutes } from '../../../test/route-stub';
import type { AuditQuarter, AuditQuarters, Me } from '../../lib/api/types';
import { fromRegionDate, toRegionDate } from '../../lib/region-dates';
import { about } from '../../../test/signed-in';

const lead: Me = {
  id: 1,
  email: 'imogen@x.example',
  displayName: 'Imogen Varley',
  role: 'regional_lead',
  regionName: 'Ostrevale',
  practices: [],
  sessionExpiresAt: '2026-12-01T18:00:00.000Z',
};
const practiceLead: Me = { ...lead, id: 3, displayName: 'Priya Calloway', role: 'practice_lead' };

const q3: AuditQuarter = {
  quarter: {
    id: 8,
    regionId: 1,
    year: 2026,
    quarter: 3,
    label: '2026 Q3',
    windowStart: '2025-10',
    windowEnd: '2026-09',
    measureSetId: 'cairn-default-2026.1',
    submissionDeadline: '2026-11-14',
    status: 'open',
    openedAt: '2026-10-01T09:00:00.000Z',
    closedAt: null,
  },
  measureSet: { id: 'cairn-default-2026.1', label: 'Cairn default measure set 2026.1' },
  coverage: {
    practices: 30,
    current: 27,
    currentWithWaiting: 1,
    awaitingConfirmation: 1,
    none: 2,
    records: 9000,
  },
  reports: [],
  actions: { close: true, reopen: false, changeDeadline: true, changeMeasureSet: true },
};

const overview = (me: Me): AuditQuarters => ({
  quarters: [
    me.role === 'practice_lead'
      ? {
          ...q3,
          coverage: null,
          actions: { close: false, reopen: false, changeDeadline: false, changeMeasureSet: false },
        }
      : q3,
  ],
  next: {
    year: 2026,
    quarter: 4,
    label: '2026 Q4',
    windowStart: '2026-01',
    windowEnd: '2026-12',
    quarterEnd: '2026-12-31',
    defaultDeadline: '2027-02-14',
    defaultMeasureSetId: 'cairn-default-2026.1',
  },
  measureSets: [{ id: 'cairn-default-2026.1', label: 'Cairn default measure set 2026.1' }],
  actions: { open: me.role === 'regional_lead' },
});

function stub(me: Me, routes: Parameters<typeof stubRoutes>[0] = {}) {
  return stubRoutes({
    'GET /api/about': { body: about },
    'GET /api/session': { body: { user: me, csrfToken: 'tok' } },
    'GET /api/quarter-overview': { body: overview(me) },
    ...routes,
  });
}

afterEach(() => vi.unstubAllGlobals());

describe('the region’s date format', () => {
  it.each([
    ['14/02/2027', '2027-02-14'],
    ['1/2/2027', '2027-02-01'],
    ['01-02-2027', '2027-02-01'],
  ])('reads %s as %s', (text, iso) => {
    expect(fromRegionDate(text)).toEqual({ ok: true, iso });
  });

  it.each([
    ['', 'Enter a date, for example 14/02/2027.'],
    ['2027-02-14', 'Write the date as DD/MM/YYYY, for example 14/02/2027.'],
    ['31/02/2027', 'There is no 31/02/2027 in the calendar.'],
    ['14/13/2027', 'There is no 14/13/2027 in the calendar.'],
  ])('refuses “%s”: %s', (text, message) => {
    expect(fromRegionDate(text)).toEqual({ ok: false, message });
  });

  it('writes ISO dates the region’s way', () => {
    expect(toRegionDate('2027-02-14')).toBe('14/02/2027');
  });
});

describe('the audit quarters page', () => {
  it('shows the regional lead each quarter with coverage, reports and actions', async () => {
    stub(lead);
    renderApp('/quarters');
    expect(await screen.findByRole('heading', { name: 'Audit quarters' })).toBeTruthy();
    const row = (await screen.findByText('2026 Q3')).closest('tr')!;
    expect(within(row).getByText('Open for extracts')).toBeTruthy();
    expect(within(row).getByText('14 Nov 2026')).toBeTruthy();
    expect(within(row).getByText('Cairn default measure set 2026.1')).toBeTruthy();
    expect(within(row).getByText('No report published yet')).toBeTruthy();
    expect(
      within(row).getByRole('link', {
        // jsdom spaces out the hidden commas; browsers read "current, 1 awaiting".
        name: /^Coverage of 2026 Q3: 27 of 30 current ?, 1 awaiting confirmation ?, 2 none$/,
      }),
    ).toBeTruthy();
    expect(within(row).getByRole('button', { name: 'Close 2026 Q3' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Open 2026 Q4' })).toBeTruthy();
    expect(document.title).toBe('Audit quarters · Cairn');
  });

  it('shows practice leads the quarters without the region’s coverage or actions', async () => {
    stub(practiceLead);
    renderApp('/quarters');
    const row = (await screen.findByText('2026 Q3')).closest('tr')!;
    expect(screen.queryByRole('columnheader', { name: 'Coverage' })).toBeNull();
    expect(within(row).queryByRole('button')).toBeNull();
    expect(screen.queryByRole('button', { name: 'Open 2026 Q4' })).toBeNull();
  });

  it('opens the next quarter: a date the calendar lacks is refused at once, a deadline too early is named by the API next to the field', async () => {
    const { calls } = stub(lead, {
      'POST /api/quarters': (body) =>
        (body as { submissionDeadline: string }).submissionDeadline <= '2026-12-31'
          ? {
              status: 422,
              body: {
                type: '/api/problems/deadline-too-early',
                title: 'The deadline is too early',
                status: 422,
                errors: [
                  {
                    field: 'submissionDeadline',
                    message:
                      'must fall after the quarter ends: 2026 Q4 ends on 31 December 2026, and its extracts cannot be complete before then',
                  },
                ],
              },
            }
          : { status: 201, body: { ...q3.quarter, id: 9, quarter: 4, label: '2026 Q4' } },
    });
    renderApp('/quarters');
    await userEvent.click(await screen.findByRole('button', { name: 'Open 2026 Q4' }));
    const dialog = await screen.findByRole('dialog');
    const deadline = within(dialog).getByLabelText(/Submission deadline/);
    expect((deadline as HTMLInputElement).value).toBe('14/02/2027');

    await userEvent.clear(deadline);
    await userEvent.type(deadline, '31/02/2027');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Open 2026 Q4' }));
    expect(within(dialog).getByText('There is no 31/02/2027 in the calendar.')).toBeTruthy();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await userEvent.clear(deadline);
    await userEvent.type(deadline, '30/12/2026');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Open 2026 Q4' }));
    const message = await within(dialog).findByText(
      'Must fall after the quarter ends: 2026 Q4 ends on 31 December 2026, and its extracts cannot be complete before then.',
    );
    expect(deadline.getAttribute('aria-invalid')).toBe('true');
    expect(deadline.getAttribute('aria-describedby')).toBe(message.id);

    await userEvent.clear(deadline);
    await userEvent.type(deadline, '21/02/2027');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Open 2026 Q4' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    expect(calls.filter((c) => c.method === 'POST').at(-1)!.body).toEqual({
      year: 2026,
      quarter: 4,
      submissionDeadline: '2027-02-21',
      measureSetId: 'cairn-default-2026.1',
    });
  });

  it('sends only what changed, and names a measure set that cannot be used', async () => {
    const { calls } = stub(lead, {
      'PATCH /api/quarters/8': {
        status: 422,
        body: {
          type: '/api/problems/measure-set-draft',
          title: 'This measure set is a draft',
          status: 422,
          errors: [
            {
              field: 'measureSetId',
              message: 'is a draft: publish it before an audit quarter uses it',
            },
          ],
        },
      },
      'GET /api/quarter-overview': {
        body: {
          ...overview(lead),
          measureSets: [
            { id: 'cairn-default-2026.1', label: 'Cairn default measure set 2026.1' },
            { id: 'cairn-default-2026.2', label: 'Ostrevale 2026.2' },
          ],
        },
      },
    });
    renderApp('/quarters');
    await userEvent.click(await screen.findByRole('button', { name: 'Change 2026 Q3' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.selectOptions(
      within(dialog).getByLabelText('Measure set'),
      'cairn-default-2026.2',
    );
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save changes' }));
    expect(
      await within(dialog).findByText('Is a draft: publish it before an audit quarter uses it.'),
    ).toBeTruthy();
    expect(calls.find((c) => c.method === 'PATCH')!.body).toEqual({
      measureSetId: 'cairn-default-2026.2',
    });
  });
});
