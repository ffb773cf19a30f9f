/**
 * Measure sets through the API: the list and one version with every measure
 * described, for every role; and opening an audit quarter, which refuses a
 * measure set Cairn does not know before anything is written.
 */
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { seedDemoOrganisation, signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const DEFAULT = 'cairn-default-2026.1';

describe('measure sets', () => {
  let t: TestApp;
  let lead: SignedInAgent;

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
    lead = await signInAs(t, 'regional_lead');
  });
  afterAll(async () => {
    await t?.close();
  });

  it.each([
    ['regional_lead', true],
    ['auditor', false],
    ['practice_lead_one', false],
  ])('lists the versions to %s, with what they may do', async (who, mayClone) => {
    const agent = who === 'regional_lead' ? lead : await signInAs(t, who);
    const res = await agent.get('/api/measure-sets').expect(200);
    expect(res.body).toEqual([
      {
        id: DEFAULT,
        label: 'Cairn default measure set 2026.1',
        description: expect.stringContaining('care processes'),
        status: 'published',
        basedOn: null,
        shippedWithCairn: true,
        contentHash: expect.stringMatching(/^[0-9a-f]{64}$/),
        careProcesses: 10,
        treatmentTargets: 10,
        isDefault: true,
        createdAt: expect.any(String),
        createdBy: 'Cairn',
        publishedAt: expect.any(String),
        publishedBy: 'Cairn',
        usedBy: [],
        actions: { clone: mayClone, edit: false, publish: false, discard: false },
      },
    ]);
  });

  it('describes every measure of a version', async () => {
    const res = await lead.get(`/api/measure-sets/${DEFAULT}`).expect(200);
    const body = res.body;
    expect(body).toMatchObject({
      id: DEFAULT,
      isDefault: true,
      eligibilityMinAge: 12,
      retinalWindowMonths: 12,
      status: 'published',
      revision: 1,
      suggestedDraftId: 'cairn-default-2026.2',
      suggestedDraftLabel: 'Cairn default measure set 2026.2',
    });
    // The definition as stored: what the content hash is of.
    expect(body.definition.id).toBe(DEFAULT);
    expect(body.definition.targets[1]).toMatchObject({ key: 'hba1c_le_53', threshold: 53 });
    expect(body.breakdowns.map((b: { key: string }) => b.key)).toEqual([
      'age_band',
      'sex',
      'deprivation',
      'duration',
    ]);
    expect(body.breakdowns[0].categories).toEqual([
      { key: '12-39', label: '12–39' },
      { key: '40-64', label: '40–64' },
      { key: '65-79', label: '65–79' },
      { key: '80+', label: '80+' },
    ]);
    expect(body.measures).toHaveLength(20);
    for (const m of body.measures) {
      expect(Object.keys(m).sort()).toEqual(
        [
          'components',
          'composite',
          'definition',
          'denominator',
          'denominatorText',
          'direction',
          'key',
          'kind',
          'label',
          'note',
          'population',
          'reads',
          'source',
        ].sort(),
      );
      expect(m.definition.length).toBeGreaterThan(10);
      expect(m.source.length).toBeGreaterThan(5);
    }
    const byKey = new Map(body.measures.map((m: { key: string }) => [m.key, m]));
    expect(byKey.get('hba1c_gt_75')).toMatchObject({
      kind: 'treatment_target',
      denominator: 'measured',
      direction: 'lower',
      definition: 'Latest HbA1c in the review window above 75 mmol/mol',
      source: 'High-risk glycaemic band (common practice)',
      reads: ['hba1c'],
    });
    expect(byKey.get('statin_40_75')).toMatchObject({
      population: {
        types: ['type1', 'type2', 'other'],
        minAge: 40,
        maxAge: 75,
        text: 'Eligible people with any type of diabetes, aged 40–75',
      },
    });
    expect(byKey.get('retinal_screening')).toMatchObject({
      kind: 'care_process',
      denominator: 'eligible',
      direction: 'higher',
      reads: ['retinalScreening'],
    });
  });

  it('answers an unknown version with 404 naming the known ones', async () => {
    const res = await lead.get('/api/measure-sets/cairn-default-1999.1').expect(404);
    expect(res.body).toMatchObject({
      type: '/api/problems/measure-set-not-found',
      measureSetId: 'cairn-default-1999.1',
      knownMeasureSets: [DEFAULT],
    });
    expect(res.body.detail).toBe(
      `Cairn has no measure set "cairn-default-1999.1". Known versions: ${DEFAULT}.`,
    );
  });

  it('is for signed-in people only', async () => {
    await request(t.http).get('/api/measure-sets').expect(401);
    await request(t.http).get(`/api/measure-sets/${DEFAULT}`).expect(401);
  });

  it('documents the measure-set DTOs in the OpenAPI document, with named enums', async () => {
    const doc = (await request(t.http).get('/api/docs/openapi.json').expect(200)).body;
    expect(Object.keys(doc.paths)).toEqual(
      expect.arrayContaining(['/api/measure-sets', '/api/measure-sets/{measureSetId}']),
    );
    const schemas = doc.components.schemas;
    expect(Object.keys(schemas)).toEqual(
      expect.arrayContaining([
        'MeasureSetDto',
        'MeasureSetSummaryDto',
        'MeasureDto',
        'MeasurePopulationDto',
        'MeasureKind',
        'DenominatorKind',
        'MeasureDirection',
        'ReadingField',
      ]),
    );
    expect(schemas.MeasureKind.enum).toEqual(['care_process', 'treatment_target']);
  });

  describe('opening an audit quarter', () => {
    const quarterCount = async () => {
      const [row] = await t.db.query<{ n: number }>('SELECT COUNT(*) AS n FROM audit_quarters', {
        type: QueryTypes.SELECT,
      });
      return Number(row!.n);
    };
    const openedEvents = async () => {
      const [row] = await t.db.query<{ n: number }>(
        "SELECT COUNT(*) AS n FROM audit_events WHERE action = 'quarter.opened'",
        { type: QueryTypes.SELECT },
      );
      return Number(row!.n);
    };

    it('refuses an unknown measure set with 422 naming the field and the known versions', async () => {
      const before = [await quarterCount(), await openedEvents()];
      const res = await lead
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, measureSetId: 'regional-2027.1' })
        .expect(422);
      expect(res.body).toEqual({
        type: '/api/problems/unknown-measure-set',
        title: 'Unknown measure set',
        status: 422,
        detail: `The measure set "regional-2027.1" is not one Cairn knows. Choose one of: ${DEFAULT}.`,
        instance: '/api/quarters',
        errors: [
          {
            field: 'measureSetId',
            message: `is not a measure set Cairn knows (known: ${DEFAULT})`,
          },
        ],
        measureSetId: 'regional-2027.1',
        knownMeasureSets: [DEFAULT],
      });
      expect([await quarterCount(), await openedEvents()]).toEqual(before);
    });

    it('still refuses a malformed id as a validation problem (400)', async () => {
      const res = await lead
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, measureSetId: '../default' })
        .expect(400);
      expect(res.body.type).toBe('/api/problems/validation');
      expect(res.body.errors[0].field).toBe('measureSetId');
    });

    it('opens a quarter with a known measure set, and with the default', async () => {
      const chosen = await lead
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, measureSetId: DEFAULT })
        .expect(201);
      expect(chosen.body.measureSetId).toBe(DEFAULT);
      const byDefault = await lead
        .post('/api/quarters')
        .send({ year: 2027, quarter: 1 })
        .expect(201);
      expect(byDefault.body.measureSetId).toBe(DEFAULT);
      // Each version says which quarters use it, latest first.
      const list = await lead.get('/api/measure-sets').expect(200);
      expect(list.body[0].usedBy).toEqual([
        { kind: 'quarter', id: byDefault.body.id, label: '2027 Q1', status: 'open' },
        { kind: 'quarter', id: chosen.body.id, label: '2026 Q4', status: 'open' },
      ]);
    });
  });
});

describe('a deployment whose default measure set is unknown', () => {
  let t: TestApp;
  afterAll(async () => {
    await t?.close();
  });

  it('refuses to open a quarter without a chosen measure set, saying the default is unknown', async () => {
    t = await createTestApp({
      configure: (config) => ({
        ...config,
        quarters: { ...config.quarters, defaultMeasureSetId: 'retired-2024.1' },
      }),
    });
    await seedDemoOrganisation(t);
    const lead = await signInAs(t, 'regional_lead');
    const res = await lead.post('/api/quarters').send({ year: 2026, quarter: 3 }).expect(422);
    expect(res.body).toMatchObject({
      type: '/api/problems/unknown-measure-set',
      detail: `No measure set was chosen, and the default "retired-2024.1" is not one Cairn knows. Choose one of: ${DEFAULT}.`,
      errors: [
        {
          field: 'measureSetId',
          message: `was not given, and this deployment's default (quarters.defaultMeasureSetId, "retired-2024.1") is not a measure set Cairn knows (known: ${DEFAULT})`,
        },
      ],
    });
    expect((await lead.get('/api/quarters').expect(200)).body).toEqual([]);
    const list = await lead.get('/api/measure-sets').expect(200);
    expect(list.body[0].isDefault).toBe(false);
  });
});
