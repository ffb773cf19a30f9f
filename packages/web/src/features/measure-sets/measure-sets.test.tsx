import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp } from '../../../test/render';
import { stubRoutes } from '../../../test/route-stub';
import type { Me, MeasureSet, MeasureSetDefinition } from '../../lib/api/types';
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

const population = { types: ['type1', 'type2', 'other'], minAge: null, maxAge: null } as const;
const definition: MeasureSetDefinition = {
  id: 'cairn-default-2026.2',
  label: 'Ostrevale 2026.2',
  eligibility: { minAge: 12 },
  retinalWindowMonths: 12,
  breakdowns: { ageBands: [12, 40, 65, 80], durationBands: [0, 2, 7, 15] },
  careProcesses: [
    {
      key: 'hba1c',
      label: 'HbA1c recorded',
      source: 'Annual review guideline',
      denominator: 'eligible',
      direction: 'higher',
      population: { ...population, types: [...population.types] },
      rule: 'recorded',
      field: 'hba1c',
      window: 'review',
    },
  ],
  targets: [
    {
      key: 'hba1c_le_48',
      label: 'HbA1c 48 or below',
      source: 'Guideline A',
      denominator: 'eligible',
      direction: 'higher',
      population: { ...population, types: [...population.types] },
      rule: 'value',
      measurement: 'hba1c',
      comparator: 'le',
      threshold: 48,
    },
    {
      key: 'hba1c_le_53',
      label: 'HbA1c 53 or below',
      source: 'Guideline B',
      denominator: 'eligible',
      direction: 'higher',
      population: { ...population, types: [...population.types] },
      rule: 'value',
      measurement: 'hba1c',
      comparator: 'le',
      threshold: 53,
    },
  ],
};

const view = (
  key: string,
  label: string,
  kind: 'care_process' | 'treatment_target',
  words: string,
) => ({
  key,
  label,
  kind,
  composite: false,
  definition: words,
  denominator: 'eligible' as const,
  denominatorText: 'Counted among everyone in the population',
  direction: 'higher' as const,
  population: {
    ...population,
    types: [...population.types],
    text: 'Eligible people with any type of diabetes',
  },
  source: 'Guideline',
  note: null,
  reads: ['hba1c' as const],
  components: [],
});

function version(overrides: Partial<MeasureSet> = {}): MeasureSet {
  return {
    id: 'cairn-default-2026.2',
    label: 'Ostrevale 2026.2',
    description: null,
    status: 'draft',
    basedOn: 'cairn-default-2026.1',
    shippedWithCairn: false,
    contentHash: 'a'.repeat(64),
    careProcesses: 1,
    treatmentTargets: 2,
    isDefault: false,
    createdAt: '2026-12-04T10:00:00.000Z',
    createdBy: 'Imogen Varley',
    publishedAt: null,
    publishedBy: null,
    usedBy: [],
    actions: { clone: false, edit: true, publish: true, discard: true },
    eligibilityMinAge: 12,
    retinalWindowMonths: 12,
    breakdowns: [],
    measures: [
      view('hba1c', 'HbA1c recorded', 'care_process', 'HbA1c recorded in the review window'),
      view('hba1c_le_48', 'HbA1c 48 or below', 'treatment_target', 'Latest HbA1c 48 or below'),
      view('hba1c_le_53', 'HbA1c 53 or below', 'treatment_target', 'Latest HbA1c 53 or below'),
    ],
    revision: 3,
    definition,
    suggestedDraftId: null,
    suggestedDraftLabel: null,
    ...overrides,
  };
}

const PATH = '/api/measure-sets/cairn-default-2026.2';

function stubLead(routes: Parameters<typeof stubRoutes>[0] = {}) {
  return stubRoutes({
    'GET /api/about': { body: about },
    'GET /api/session': { body: { user: lead, csrfToken: 'tok' } },
    [`GET ${PATH}`]: { body: version() },
    [`GET ${PATH}/changes`]: {
      body: {
        id: 'cairn-default-2026.2',
        basedOn: 'cairn-default-2026.1',
        basedOnLabel: 'x',
        changes: [],
      },
    },
    ...routes,
  });
}

/** The form group of a field, by its label. */
const fieldOf = (dialog: HTMLElement, label: string) =>
  within(dialog).getByLabelText(label).closest('.cairn-field') as HTMLElement;

afterEach(() => vi.unstubAllGlobals());

describe('a measure set draft', () => {
  it('shows every measure with its definition, and the draft’s actions', async () => {
    stubLead();
    renderApp('/measure-sets/cairn-default-2026.2');
    expect(await screen.findByRole('heading', { name: /Ostrevale 2026\.2/ })).toBeTruthy();
    expect(screen.getByText('Latest HbA1c 53 or below')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Publish…' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Edit HbA1c 53 or below' })).toBeTruthy();
    expect(await screen.findByText('No differences yet')).toBeTruthy();
  });

  it('shows the schema’s error next to the threshold that caused it, then saves the fix', async () => {
    const { calls } = stubLead({
      [`PUT ${PATH}`]: (body) => {
        const sent = body as { definition: MeasureSetDefinition };
        const threshold = (sent.definition.targets[1] as { threshold: number }).threshold;
        return threshold > 200
          ? {
              status: 422,
              body: {
                type: '/api/problems/invalid-measure-set',
                title: 'The measure set is not valid',
                status: 422,
                detail: 'One problem, nothing was saved.',
                errors: [
                  {
                    field: 'definition.targets[1].threshold',
                    message: 'must be between 20 and 200 mmol/mol (the plausible range of HbA1c)',
                  },
                ],
              },
            }
          : { body: version({ revision: 4 }) };
      },
    });
    renderApp('/measure-sets/cairn-default-2026.2');
    await userEvent.click(await screen.findByRole('button', { name: 'Edit HbA1c 53 or below' }));
    const dialog = await screen.findByRole('dialog');
    const threshold = within(dialog).getByLabelText('Threshold');
    await userEvent.clear(threshold);
    await userEvent.type(threshold, '530');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save to the draft' }));

    const field = await waitFor(() => {
      const f = fieldOf(dialog, 'Threshold');
      expect(f.textContent).toContain(
        'Must be between 20 and 200 mmol/mol (the plausible range of HbA1c).',
      );
      return f;
    });
    expect(threshold.getAttribute('aria-invalid')).toBe('true');
    expect(
      document.getElementById(threshold.getAttribute('aria-describedby')!)!.textContent,
    ).toMatch(/plausible range of HbA1c/);
    // The other fields show no problem.
    expect(fieldOf(dialog, 'Label').textContent).not.toMatch(/Must/);
    expect(within(dialog).getByText('One problem to fix; nothing was saved')).toBeTruthy();
    const put = calls.find((c) => c.method === 'PUT')!;
    expect(put.body).toMatchObject({ revision: 3 });
    expect(field).toBeTruthy();

    await userEvent.clear(threshold);
    await userEvent.type(threshold, '50');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save to the draft' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).toBeNull());
    const saved = calls.filter((c) => c.method === 'PUT').at(-1)!.body as {
      definition: MeasureSetDefinition;
    };
    expect(saved.definition.targets[1]).toMatchObject({ key: 'hba1c_le_53', threshold: 50 });
    // Only the edited measure changed.
    expect(saved.definition.targets[0]).toEqual(definition.targets[0]);
  });

  it('refuses text that is not a number before sending anything', async () => {
    const { calls } = stubLead();
    renderApp('/measure-sets/cairn-default-2026.2');
    await userEvent.click(await screen.findByRole('button', { name: 'Edit HbA1c 53 or below' }));
    const dialog = await screen.findByRole('dialog');
    const threshold = within(dialog).getByLabelText('Threshold');
    await userEvent.clear(threshold);
    await userEvent.type(threshold, 'high');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save to the draft' }));
    expect(fieldOf(dialog, 'Threshold').textContent).toContain('“high” is not a number.');
    await userEvent.clear(threshold);
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save to the draft' }));
    expect(fieldOf(dialog, 'Threshold').textContent).toContain('Enter a number.');
    expect(calls.some((c) => c.method === 'PUT')).toBe(false);
  });

  it('names a duplicate key next to the key, and lists problems outside the form', async () => {
    stubLead({
      [`PUT ${PATH}`]: {
        status: 422,
        body: {
          type: '/api/problems/invalid-measure-set',
          title: 'The measure set is not valid',
          status: 422,
          errors: [
            {
              field: 'definition.targets[1].key',
              message: 'duplicate key "hba1c_le_48" (also targets[0])',
            },
            {
              field: 'definition.targets[9].of[0].key',
              message: '"hba1c_le_53" is not a target defined before this one',
            },
          ],
        },
      },
    });
    renderApp('/measure-sets/cairn-default-2026.2');
    await userEvent.click(await screen.findByRole('button', { name: 'Edit HbA1c 53 or below' }));
    const dialog = await screen.findByRole('dialog');
    const key = within(dialog).getByLabelText('Key');
    await userEvent.clear(key);
    await userEvent.type(key, 'hba1c_le_48');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save to the draft' }));
    await waitFor(() =>
      expect(fieldOf(dialog, 'Key').textContent).toContain(
        'Duplicate key "hba1c_le_48" (also targets[0]).',
      ),
    );
    const alert = within(dialog).getByRole('alert');
    expect(alert.textContent).toContain('2 problems to fix; nothing was saved');
    expect(alert.textContent).toContain('targets[9].of[0].key');
  });

  it('names the id a new draft cannot take', async () => {
    stubLead({
      'GET /api/measure-sets/cairn-default-2026.1': {
        body: version({
          id: 'cairn-default-2026.1',
          label: 'Cairn default 2026.1',
          status: 'published',
          basedOn: null,
          actions: { clone: true, edit: false, publish: false, discard: false },
          suggestedDraftId: 'cairn-default-2026.2',
          suggestedDraftLabel: 'Cairn default 2026.2',
        }),
      },
      'POST /api/measure-sets/cairn-default-2026.1/drafts': {
        status: 422,
        body: {
          type: '/api/problems/measure-set-id-taken',
          title: 'Choose another id for the draft',
          status: 422,
          errors: [{ field: 'id', message: 'is already used by another version' }],
        },
      },
    });
    renderApp('/measure-sets/cairn-default-2026.1');
    await userEvent.click(
      await screen.findByRole('button', { name: 'Start a draft from this version' }),
    );
    const dialog = await screen.findByRole('dialog');
    expect((within(dialog).getByLabelText('Version id') as HTMLInputElement).value).toBe(
      'cairn-default-2026.2',
    );
    await userEvent.click(within(dialog).getByRole('button', { name: 'Start the draft' }));
    await waitFor(() =>
      expect(within(dialog).getByText('Is already used by another version.')).toBeTruthy(),
    );
    expect(within(dialog).getByLabelText('Version id').getAttribute('aria-invalid')).toBe('true');
  });
});
