/**
 * Measure sets in MariaDB: seeding from config/measure-sets/ (once, and
 * refusing a file that no longer matches its published version), drafts
 * started from a published version, saved whole and validated by the
 * measure-set schema (every problem named by its field, nothing stored
 * half), the differences from the version a draft came from, publishing,
 * discarding, and who may do what in which region.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseMeasureSet } from '@cairn/metrics';
import { QueryTypes } from 'sequelize';
import { findRepoRoot } from '../src/config/load-config.js';
import { canonicalJson, contentHash } from '../src/measure-sets/canonical.js';
import { MeasureSetsService } from '../src/measure-sets/measure-sets.service.js';
import { addRegion, addUser } from '../src/users/operator-commands.js';
import { seedDemoOrganisation, signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const DEFAULT = 'cairn-default-2026.1';
const DRAFT = 'cairn-default-2026.2';
const shippedFile = join(findRepoRoot(), 'config', 'measure-sets', `${DEFAULT}.json`);
const shipped = () => JSON.parse(readFileSync(shippedFile, 'utf8')) as Record<string, unknown>;

interface Definition {
  id: string;
  label: string;
  careProcesses: { key: string; of?: string[] }[];
  targets: { key: string; threshold?: number; label: string }[];
}

describe('measure sets in the database', () => {
  let t: TestApp;
  let lead: SignedInAgent;
  let auditor: SignedInAgent;
  let practiceLead: SignedInAgent;

  const row = async (id: string) =>
    (
      await t.db.query<{
        status: string;
        revision: number;
        definition: string;
        content_hash: string;
      }>('SELECT status, revision, definition, content_hash FROM measure_sets WHERE id = ?', {
        replacements: [id],
        type: QueryTypes.SELECT,
      })
    )[0];
  const events = async (action: string) => {
    const [r] = await t.db.query<{ n: number }>(
      'SELECT COUNT(*) AS n FROM audit_events WHERE action = ?',
      { replacements: [action], type: QueryTypes.SELECT },
    );
    return Number(r!.n);
  };
  const draft = async (): Promise<{ revision: number; definition: Definition }> =>
    (await lead.get(`/api/measure-sets/${DRAFT}`).expect(200)).body;

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
    lead = await signInAs(t, 'regional_lead');
    auditor = await signInAs(t, 'auditor');
    practiceLead = await signInAs(t, 'practice_lead_one');
  });
  afterAll(async () => {
    await t?.close();
  });

  describe('seeding from config/measure-sets/', () => {
    it('stores each file once, as canonical JSON with its SHA-256', async () => {
      const stored = await row(DEFAULT);
      const expected = canonicalJson(parseMeasureSet(shipped()));
      expect(stored).toMatchObject({ status: 'published', revision: 1, definition: expected });
      expect(stored!.content_hash).toBe(contentHash(expected));
      // Starting again (another process, a restart) changes nothing.
      await t.app.get(MeasureSetsService).seedFromFiles();
      expect(await row(DEFAULT)).toEqual(stored);
    });
  });

  describe('starting a draft', () => {
    it('refuses an id that is not a versioned id, or already used, naming the field', async () => {
      const bad = await lead
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: 'My set', label: 'x' })
        .expect(400);
      expect(bad.body.errors).toEqual([
        { field: 'id', message: "must be a versioned id such as 'cairn-default-2026.2'" },
      ]);
      const taken = await lead
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: DEFAULT, label: 'Again' })
        .expect(422);
      expect(taken.body).toMatchObject({
        type: '/api/problems/measure-set-id-taken',
        errors: [{ field: 'id', message: 'is already used by another version' }],
      });
      const empty = await lead
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: DRAFT, label: '' })
        .expect(400);
      expect(empty.body.errors).toEqual([{ field: 'label', message: 'must not be empty' }]);
      expect(await row(DRAFT)).toBeUndefined();
    });

    it('starts a draft from a published version (regional lead only)', async () => {
      await auditor
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: DRAFT, label: 'x' })
        .expect(403);
      await practiceLead
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: DRAFT, label: 'x' })
        .expect(403);
      const res = await lead
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: DRAFT, label: 'Ostrevale measure set 2026.2' })
        .expect(201);
      expect(res.body).toMatchObject({
        id: DRAFT,
        label: 'Ostrevale measure set 2026.2',
        status: 'draft',
        basedOn: DEFAULT,
        shippedWithCairn: false,
        revision: 1,
        createdBy: 'Imogen Varley',
        publishedAt: null,
        actions: { clone: false, edit: true, publish: true, discard: true },
      });
      expect(res.body.definition.id).toBe(DRAFT);
      expect(res.body.definition.targets).toEqual(
        JSON.parse(canonicalJson(parseMeasureSet(shipped()))).targets,
      );
      expect(await events('measure_set.draft_started')).toBe(1);
      // The next suggestion skips the id now taken.
      const source = await lead.get(`/api/measure-sets/${DEFAULT}`).expect(200);
      expect(source.body.suggestedDraftId).toBe('cairn-default-2026.3');
    });

    it('shows the draft to the region’s regional lead and auditor, not to practice leads', async () => {
      const ids = async (agent: SignedInAgent) =>
        (await agent.get('/api/measure-sets').expect(200)).body.map((m: { id: string }) => m.id);
      expect(await ids(lead)).toEqual([DEFAULT, DRAFT]);
      expect(await ids(auditor)).toEqual([DEFAULT, DRAFT]);
      expect(await ids(practiceLead)).toEqual([DEFAULT]);
      const seen = await auditor.get(`/api/measure-sets/${DRAFT}`).expect(200);
      expect(seen.body.actions).toEqual({
        clone: false,
        edit: false,
        publish: false,
        discard: false,
      });
      await practiceLead.get(`/api/measure-sets/${DRAFT}`).expect(404);
      await practiceLead.get(`/api/measure-sets/${DRAFT}/changes`).expect(404);
    });

    it('refuses to start a draft from a draft', async () => {
      const res = await lead
        .post(`/api/measure-sets/${DRAFT}/drafts`)
        .send({ id: 'cairn-default-2026.9', label: 'x' })
        .expect(409);
      expect(res.body.type).toBe('/api/problems/measure-set-not-published');
    });
  });

  describe('saving a draft', () => {
    /** Sends the draft with one change; checks the status and returns the answer. */
    const save = async (
      edit: (d: Definition) => void,
      status: number,
      agent: SignedInAgent = lead,
    ) => {
      const current = await draft();
      const definition = structuredClone(current.definition);
      edit(definition);
      return agent
        .put(`/api/measure-sets/${DRAFT}`)
        .send({ revision: current.revision, definition })
        .expect(status);
    };

    it.each([
      [
        'an HbA1c threshold outside its plausible range',
        (d: Definition) => (d.targets[1]!.threshold = 530),
        [
          {
            field: 'definition.targets[1].threshold',
            message: 'must be between 20 and 200 mmol/mol (the plausible range of HbA1c)',
          },
        ],
      ],
      [
        'a threshold that is not a number',
        (d: Definition) => ((d.targets[1] as { threshold: unknown }).threshold = 'fifty'),
        [{ field: 'definition.targets[1].threshold', message: 'expected a number, got a string' }],
      ],
      [
        'an empty composite',
        (d: Definition) => (d.careProcesses[9]!.of = []),
        [{ field: 'definition.careProcesses[9].of', message: 'must have at least 1 item(s)' }],
      ],
      [
        'a duplicate key',
        (d: Definition) => (d.targets[1]!.key = 'hba1c_le_48'),
        [
          {
            field: 'definition.targets[1].key',
            message: 'duplicate key "hba1c_le_48" (also targets[0])',
          },
          // The composite that named the old key now names nothing.
          {
            field: 'definition.targets[9].of[0].key',
            message: '"hba1c_le_53" is not a target defined before this one',
          },
        ],
      ],
      [
        'a changed id',
        (d: Definition) => (d.id = 'cairn-default-2026.7'),
        [
          {
            field: 'definition.id',
            message: `must stay "${DRAFT}": a draft keeps its id`,
          },
        ],
      ],
    ])('refuses %s with a message naming the field, storing nothing', async (_, edit, errors) => {
      const before = await row(DRAFT);
      const saved = await events('measure_set.draft_saved');
      const res = await save(edit, 422);
      expect(res.body.type).toBe('/api/problems/invalid-measure-set');
      expect(res.body.errors).toEqual(errors);
      expect(res.body.detail).toContain('nothing was saved');
      expect(await row(DRAFT)).toEqual(before);
      expect(await events('measure_set.draft_saved')).toBe(saved);
    });

    it('saves a valid change, and shows the differences from the version it came from', async () => {
      const res = await save((d) => {
        d.targets[1]!.threshold = 50;
        d.targets[1]!.label = 'HbA1c 50 mmol/mol or below';
      }, 200);
      expect(res.body).toMatchObject({ revision: 2, status: 'draft' });
      const measure = res.body.measures.find((m: { key: string }) => m.key === 'hba1c_le_53');
      expect(measure.definition).toBe('Latest HbA1c in the review window 50 mmol/mol or below');
      expect(await events('measure_set.draft_saved')).toBe(1);

      const changes = await auditor.get(`/api/measure-sets/${DRAFT}/changes`).expect(200);
      expect(changes.body).toEqual({
        id: DRAFT,
        basedOn: DEFAULT,
        basedOnLabel: 'Cairn default measure set 2026.1',
        changes: [
          {
            kind: 'changed',
            measureKey: null,
            measureLabel: null,
            field: 'label',
            fieldLabel: 'Label',
            before: 'Cairn default measure set 2026.1',
            after: 'Ostrevale measure set 2026.2',
          },
          {
            kind: 'changed',
            measureKey: 'hba1c_le_53',
            measureLabel: 'HbA1c 50 mmol/mol or below',
            field: 'label',
            fieldLabel: 'Label',
            before: 'HbA1c 53 mmol/mol (7.0 %) or below',
            after: 'HbA1c 50 mmol/mol or below',
          },
          {
            kind: 'changed',
            measureKey: 'hba1c_le_53',
            measureLabel: 'HbA1c 50 mmol/mol or below',
            field: 'threshold',
            fieldLabel: 'Threshold',
            before: '53',
            after: '50',
          },
          {
            kind: 'changed',
            measureKey: 'hba1c_le_53',
            measureLabel: 'HbA1c 50 mmol/mol or below',
            field: 'definition',
            fieldLabel: 'Definition in words',
            before: 'Latest HbA1c in the review window 53 mmol/mol or below',
            after: 'Latest HbA1c in the review window 50 mmol/mol or below',
          },
          // The composite's definition names the target by its label.
          expect.objectContaining({
            measureKey: 'targets_composite',
            field: 'definition',
          }),
        ],
      });
    });

    it('refuses a save made to an older revision (someone saved meanwhile)', async () => {
      const current = await draft();
      const res = await lead
        .put(`/api/measure-sets/${DRAFT}`)
        .send({ revision: current.revision - 1, definition: current.definition })
        .expect(409);
      expect(res.body).toMatchObject({
        type: '/api/problems/measure-set-draft-changed',
        revision: current.revision,
      });
    });

    it('lets only regional leads save', async () => {
      await save((d) => (d.targets[0]!.threshold = 47), 403, auditor);
      await save((d) => (d.targets[0]!.threshold = 47), 403, practiceLead);
    });
  });

  describe('publishing', () => {
    it('is refused for a quarter while the version is a draft', async () => {
      const res = await lead
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, measureSetId: DRAFT })
        .expect(422);
      expect(res.body).toMatchObject({
        type: '/api/problems/measure-set-draft',
        errors: [
          {
            field: 'measureSetId',
            message: 'is a draft: publish it before an audit quarter uses it',
          },
        ],
      });
    });

    it('publishes the draft as a new version, which never changes again', async () => {
      const current = await draft();
      await lead
        .post(`/api/measure-sets/${DRAFT}/publish`)
        .send({ revision: current.revision - 1 })
        .expect(409);
      const res = await lead
        .post(`/api/measure-sets/${DRAFT}/publish`)
        .send({ revision: current.revision })
        .expect(200);
      expect(res.body).toMatchObject({
        status: 'published',
        publishedBy: 'Imogen Varley',
        actions: { clone: true, edit: false, publish: false, discard: false },
      });
      expect(await events('measure_set.published')).toBe(1);

      const edit = await lead
        .put(`/api/measure-sets/${DRAFT}`)
        .send({ revision: res.body.revision, definition: res.body.definition })
        .expect(409);
      expect(edit.body.type).toBe('/api/problems/measure-set-published');
      const discard = await lead.delete(`/api/measure-sets/${DRAFT}`).expect(409);
      expect(discard.body.type).toBe('/api/problems/measure-set-published');
      // Not even a direct UPDATE gets through: the table refuses it.
      await expect(
        t.db.query("UPDATE measure_sets SET label = 'x' WHERE id = ?", {
          replacements: [DRAFT],
          type: QueryTypes.UPDATE,
        }),
      ).rejects.toThrow(/a published measure set never changes/);
      await expect(
        t.db.query('DELETE FROM measure_sets WHERE id = ?', {
          replacements: [DRAFT],
          type: QueryTypes.BULKDELETE,
        }),
      ).rejects.toThrow(/never deleted/);
      // Every reader now sees it, and a quarter may use it.
      const seen = await practiceLead.get('/api/measure-sets').expect(200);
      expect(seen.body.map((m: { id: string }) => m.id)).toEqual([DEFAULT, DRAFT]);
      const quarter = await lead
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, measureSetId: DRAFT })
        .expect(201);
      expect(quarter.body.measureSetId).toBe(DRAFT);
    });
  });

  describe('discarding and regions', () => {
    it('discards a draft, and nothing else', async () => {
      await lead
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: 'cairn-default-2026.3', label: 'Scratch' })
        .expect(201);
      await auditor.delete('/api/measure-sets/cairn-default-2026.3').expect(403);
      const res = await lead.delete('/api/measure-sets/cairn-default-2026.3').expect(200);
      expect(res.body).toEqual({ id: 'cairn-default-2026.3', basedOn: DEFAULT });
      await lead.get('/api/measure-sets/cairn-default-2026.3').expect(404);
      await lead.delete('/api/measure-sets/cairn-default-2026.3').expect(404);
      expect(await events('measure_set.draft_discarded')).toBe(1);
    });

    it('keeps a region’s versions to that region', async () => {
      await addRegion(t.db, 'NORTH', 'North Vale');
      await addUser(t.db, {
        region: 'NORTH',
        email: 'north.lead@northvale.example',
        name: 'North Lead',
        role: 'regional_lead',
        practices: [],
      });
      const north = await signInAs(t, 'north.lead@northvale.example', {
        persona: { role: 'regional_lead', practices: [] },
      });
      const list = await north.get('/api/measure-sets').expect(200);
      expect(list.body.map((m: { id: string }) => m.id)).toEqual([DEFAULT]);
      await north.get(`/api/measure-sets/${DRAFT}`).expect(404);
      // A version of another region cannot be used for a quarter either.
      const res = await north
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, measureSetId: DRAFT })
        .expect(422);
      expect(res.body.type).toBe('/api/problems/unknown-measure-set');
      // The shipped version says which of this region's quarters use it: none.
      expect(list.body[0].usedBy).toEqual([]);
    });
  });
});
