import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from '../../../test/render';
import { type Route, stubRoutes } from '../../../test/route-stub';
import { stubSignedIn } from '../../../test/signed-in';
import benchmark from '../../../test/fixtures/benchmark-q8.json';
import funnel from '../../../test/fixtures/funnel-q8-hba1c.json';
import ov102 from '../../../test/fixtures/results-ov102-priya.json';
import trend from '../../../test/fixtures/trend-q8-hba1c.json';
import type { Me, RegionBenchmark } from '../../lib/api/types';
import { fetchRegionBenchmark } from './api/benchmark';
import { neutraliseCell, sortRows, tableCsv, tableRows } from './components/table-rows';

// Fixtures: answers of the API over the demo region (2026 Q3), trimmed to four practices
// (OV101, OV102, OV201, OV205; OV303 missing) and three measures.
const slow = { timeout: 15_000 };
const data = benchmark as unknown as RegionBenchmark;

function stub(role: Me['role'], extra: Record<string, Route> = {}) {
  return stubSignedIn(role, {
    'GET /api/quarters/8/benchmark?split=all': { body: benchmark },
    'GET /api/quarters/8/benchmark/measures/hba1c?split=all': { body: funnel },
    'GET /api/practices/2/quarters/8/results': { body: ov102 },
    'GET /api/quarters/8/benchmark/trend?measure=hba1c&split=all': { body: trend },
    ...extra,
  });
}

// Each page test loads lazy chunks and renders a large table: more than the default 5 s.
vi.setConfig({ testTimeout: 30_000 });

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('Region benchmark page', () => {
  it('draws every practice on the funnel with its flag in words, and says who is missing', async () => {
    stub('auditor');
    renderApp('/benchmark');
    await screen.findByRole('heading', { name: 'Region benchmark' }, slow);
    const points = await screen.findAllByRole('button', { name: /^OV\d{3} / }, slow);
    expect(points.map((p) => p.getAttribute('aria-label'))).toEqual([
      'OV101 Wrenfield Health Centre: 84.5 %, 941 of 1,113; Notable: below the 95 % limit (worse than the region)',
      'OV102 Quarrybank Surgery: 93.3 %, 417 of 447; Outlier: above the 99.8 % limit (better than the region)',
      'OV201 Cindermere Lakeside Surgery: 53.2 %, 305 of 573; Outlier: below the 99.8 % limit (worse than the region)',
      'OV205 Hobthrush Lane Practice: 89.8 %, 176 of 196; Within the 95 % limits: in line with the region',
    ]);
    expect(screen.getByTestId('coverage').textContent).toContain(
      'Missing (shown as missing, not as zero): OV303 Wickerby Road Surgery',
    );
    expect(screen.getByText(/Over-dispersion is present \(φ = 8\.06\)/)).toBeTruthy();
    expect(screen.getAllByText(/not clinical advice/).length).toBeGreaterThan(0);
    expect(screen.getByText(/Guideline: NICE NG28/)).toBeTruthy();
  });

  it('shows a card on focus and opens the practice’s results on Enter', async () => {
    stub('regional_lead');
    renderApp('/benchmark');
    const point = (await screen.findAllByRole('button', { name: /^OV102 / }, slow))[0]!;
    fireEvent.focus(point);
    expect(screen.getByRole('status').textContent).toMatch(/O\/E/);
    fireEvent.keyDown(point, { key: 'Enter' });
    await screen.findByRole('heading', { name: 'Quarrybank Surgery (OV102)' }, slow);
  });

  it('switches to limits allowing for over-dispersion and to case-mix-adjusted rates', async () => {
    stub('regional_lead');
    const { container } = renderApp('/benchmark');
    await screen.findAllByRole('button', { name: /^OV102 / }, slow);
    const before = container.querySelector('path.cairn-limit-outer')!.getAttribute('d');
    await userEvent.click(screen.getByLabelText('Limits allowing for over-dispersion'));
    // The address changes first (the route's loader runs), then the plot.
    await waitFor(() =>
      expect(container.querySelector('path.cairn-limit-outer')!.getAttribute('d')).not.toBe(before),
    );
    // OV201 is still beyond the wider limits
    expect(screen.getByRole('button', { name: /^OV201 / }).getAttribute('aria-label')).toMatch(
      /Outlier: below the 99\.8 % limit/,
    );
    await userEvent.click(screen.getByLabelText('Case-mix-adjusted rates'));
    const adjusted = funnel.points.find((p) => p.practice.code === 'OV102')!.caseMix.adjustedRate!;
    await waitFor(() =>
      expect(screen.getByRole('button', { name: /^OV102 / }).getAttribute('aria-label')).toContain(
        `${(adjusted * 100).toFixed(1)} %`,
      ),
    );
  });

  it('offers the funnel as a table', async () => {
    stub('auditor');
    renderApp('/benchmark');
    await screen.findAllByRole('button', { name: /^OV102 / }, slow);
    await userEvent.click(screen.getByLabelText('Show funnel plot as a table'));
    const table = screen.getByRole('table', { name: /HbA1c recorded, 2026 Q3: figures/ });
    const row = within(table).getByRole('row', { name: /OV201/ });
    expect(within(row).getByText('Outlier, worse')).toBeTruthy();
    expect(within(row).getByText('573')).toBeTruthy();
  });

  it('draws the region’s rate by quarter for the funnel’s measure, with a table alternative', async () => {
    stub('auditor');
    renderApp('/benchmark');
    await screen.findByRole('heading', { name: 'The region over time' }, slow);
    const chart = await screen.findByRole(
      'img',
      {
        name: /^HbA1c recorded, the region by quarter: 8 quarters with figures, 2024 Q4 87\.3 % to 2026 Q3 87\.7 %\. No run-chart signal\.$/,
      },
      slow,
    );
    expect(chart.querySelectorAll('.cairn-trend-point')).toHaveLength(8);
    await userEvent.click(screen.getByLabelText('Show region trend as a table'));
    const table = screen.getByRole('table', {
      name: 'HbA1c recorded, the region by quarter: figures',
    });
    const row = within(table).getByRole('row', { name: /2026 Q3/ });
    expect(within(row).getByText('87.7 %')).toBeTruthy();
    expect(
      within(row).getByText(trend.region.points.at(-1)!.n.toLocaleString('en-GB')),
    ).toBeTruthy();
  });

  it('asks for the benchmark and the funnel once, as navigation begins, when the address names them', async () => {
    const { calls } = stub('regional_lead');
    renderApp('/benchmark?quarter=8&measure=hba1c');
    await screen.findAllByRole('button', { name: /^OV102 / }, slow);
    const paths = calls.map((c) => c.path);
    const funnelAt = paths.indexOf('/api/quarters/8/benchmark/measures/hba1c?split=all');
    expect(funnelAt).toBeGreaterThanOrEqual(0);
    expect(funnelAt).toBeLessThan(paths.indexOf('/api/session'));
    expect(
      paths.filter((p) => p === '/api/quarters/8/benchmark/measures/hba1c?split=all'),
    ).toHaveLength(1);
    expect(paths.filter((p) => p === '/api/quarters/8/benchmark?split=all')).toHaveLength(1);
  });

  it('says so when no practice has an accepted submission', async () => {
    stub('auditor', {
      'GET /api/quarters/8/benchmark?split=all': {
        body: { ...benchmark, state: 'no-accepted-submissions', practices: [], builtFrom: null },
      },
    });
    renderApp('/benchmark');
    await screen.findByRole('heading', { name: 'No accepted submissions for 2026 Q3' }, slow);
    expect(screen.queryByRole('button', { name: /^OV/ })).toBeNull();
  });

  it('is not offered to a practice lead', async () => {
    stub('practice_lead');
    renderApp('/benchmark');
    await screen.findByRole('heading', { name: 'Not available for your role' }, slow);
  });
});

describe('practices × measures rows', () => {
  it('reads every page of the practices, all of one stored result', async () => {
    const path = '/api/quarters/8/benchmark?split=all';
    const paged = (from: number, to: number, page: number, resultId: number) => ({
      ...data,
      builtFrom: { ...data.builtFrom!, resultId },
      practices: data.practices.slice(from, to),
      page: { page, pageSize: 2, pages: 2, total: data.practices.length },
    });
    const { calls } = stubRoutes({
      [`GET ${path}`]: { body: paged(0, 2, 1, 41) },
      [`GET ${path}&page=2`]: { body: paged(2, 4, 2, 41) },
    });
    const all = await fetchRegionBenchmark(path);
    expect(all.practices.map((p) => p.practice.code)).toEqual(['OV101', 'OV102', 'OV201', 'OV205']);
    expect(all.page).toEqual({ page: 1, pageSize: 2, pages: 1, total: 4 });
    expect(calls.map((c) => c.path)).toEqual([path, `${path}&page=2`]);
    expect(tableRows(all).map((r) => r.practice.code)).toEqual(
      tableRows(data).map((r) => r.practice.code),
    );
  });

  it('reads the pages again when a confirm came in between them', async () => {
    const path = '/api/quarters/8/benchmark?split=all';
    let firstPages = 0;
    const page = (from: number, to: number, n: number, resultId: number) => ({
      ...data,
      builtFrom: { ...data.builtFrom!, resultId },
      practices: data.practices.slice(from, to),
      page: { page: n, pageSize: 2, pages: 2, total: 4 },
    });
    vi.stubGlobal('fetch', async (input: string) => {
      const url = String(input);
      const body = url.endsWith('&page=2')
        ? page(2, 4, 2, 42)
        : page(0, 2, 1, firstPages++ === 0 ? 41 : 42);
      return new Response(JSON.stringify(body), {
        status: 200,
        headers: { 'Content-Type': 'application/json' },
      });
    });
    const all = await fetchRegionBenchmark(path);
    expect(firstPages).toBe(2);
    expect(all.builtFrom!.resultId).toBe(42);
    expect(all.practices).toHaveLength(4);
  });

  it('lists the missing practice as missing, last whatever the order', () => {
    const rows = tableRows(data);
    expect(rows.map((r) => r.practice.code)).toEqual(['OV101', 'OV102', 'OV201', 'OV205', 'OV303']);
    expect(rows[4]!.cells).toEqual([null, null, null]);
    const asc = sortRows(rows, data, 'measure:hba1c', false).map((r) => r.practice.code);
    const desc = sortRows(rows, data, 'measure:hba1c', true).map((r) => r.practice.code);
    expect(asc).toEqual(['OV201', 'OV101', 'OV205', 'OV102', 'OV303']);
    expect(desc).toEqual(['OV102', 'OV205', 'OV101', 'OV201', 'OV303']);
    expect(sortRows(rows, data, 'quality', true)[0]!.practice.code).toBe('OV205');
  });

  it('writes the CSV with n, events, rate and flag per measure', () => {
    const csv = tableCsv(data, tableRows(data)).split('\r\n');
    expect(csv[0]).toBe(
      'practice_code,practice_name,locality,data_quality_flags,hba1c_n,hba1c_events,hba1c_rate,hba1c_flag,all_processes_n,all_processes_events,all_processes_rate,all_processes_flag,hba1c_le_53_n,hba1c_le_53_events,hba1c_le_53_rate,hba1c_le_53_flag',
    );
    expect(csv[3]).toMatch(
      /^OV201,Cindermere Lakeside Surgery,Cindermere,0,573,305,0\.5323,"Outlier, worse",/,
    );
    expect(csv[5]).toBe(
      'OV303,Wickerby Road Surgery,Lowbrace,no submission,,,,no submission,,,,no submission,,,,no submission',
    );
  });

  it.each([
    ['=HYPERLINK("x")', `'=HYPERLINK("x")`],
    ['+1', "'+1"],
    ['-1', "'-1"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['Quarrybank', 'Quarrybank'],
  ])('neutralises %s', (input, output) => {
    expect(neutraliseCell(input)).toBe(output);
  });
});
