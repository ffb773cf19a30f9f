/**
 * Measure sets, versioned (docs/methods.md §2–3): the one place the rest of the
 * API gets them from. Versions live in MariaDB (`measure_sets`, written only
 * by MeasureSetRepository), so every API process sees the same ones. The
 * files of config/measure-sets/ (file name = id) seed it at start: a file's
 * version is inserted once, and a file that no longer matches the version
 * stored under its id stops the start, naming both (a published version
 * never changes; a change is a new version).
 *
 * A published version is validated (parseMeasureSet), compiled
 * (compileMeasureSet) and described once, then kept in memory by id: its
 * content never changes, so the cache cannot be stale. Drafts are read from
 * the database every time and never cached. Who may read and change what is
 * measure-set-policy.ts.
 */
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { HttpStatus, Inject, Injectable, type OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import {
  type CompiledMeasureSet,
  compileMeasureSet,
  type MeasureSet,
  MeasureSetError,
  parseMeasureSet,
  safeParseMeasureSet,
} from '@cairn/metrics';
import { UniqueConstraintError } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { CairnConfig } from '../config/config.schema.js';
import { findRepoRoot } from '../config/load-config.js';
import { canonicalJson, contentHash } from './canonical.js';
import { describeMeasures, type MeasureView } from './describe.js';
import type {
  CloneMeasureSetDto,
  DiscardedMeasureSetDto,
  MeasureSetChangesDto,
  MeasureSetDto,
  MeasureSetSummaryDto,
  PublishMeasureSetDto,
  SaveMeasureSetDraftDto,
} from './dto/measure-set.dto.js';
import { measureSetChanges } from './measure-set-changes.js';
import { mayRead, mayStartDrafts, measureSetActions } from './measure-set-policy.js';
import { MeasureSetUsage } from './measure-set-usage.js';
import { toMeasureSetDto, toMeasureSetSummary } from './measure-set-views.js';
import { type MeasureSetRow, MeasureSetRepository } from './measure-set.repository.js';

export interface MeasureSetVersion {
  id: string;
  label: string;
  description: string | null;
  definition: MeasureSet;
  compiled: CompiledMeasureSet;
  /** Every measure, care processes first, in the compiled order (index = compiled index) */
  measures: MeasureView[];
}

/** The folder of the measure-set files. */
export const MEASURE_SET_FOLDER = join('config', 'measure-sets');

const ID_FILE = /^([a-z][a-z0-9-]*-\d{4}\.\d+)\.json$/;
const VERSIONED_ID = /^(.*-\d{4}\.)(\d+)$/;

/** A validated definition, compiled and described. */
export function versionOf(definition: MeasureSet): MeasureSetVersion {
  return {
    id: definition.id,
    label: definition.label,
    description: definition.description ?? null,
    definition,
    compiled: compileMeasureSet(definition),
    measures: describeMeasures(definition),
  };
}

/** Decodes one measure-set file; throws an Error naming the file and every problem. */
export function decodeMeasureSet(file: string, text: string): MeasureSetVersion {
  const name = file.split('/').pop() ?? file;
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new Error(`measure set ${name} is not valid JSON: ${(error as Error).message}`, {
      cause: error,
    });
  }
  let definition: MeasureSet;
  try {
    definition = parseMeasureSet(json);
  } catch (error) {
    if (error instanceof MeasureSetError) {
      throw new Error(`measure set ${name}: ${error.message}`, { cause: error });
    }
    throw error;
  }
  const expected = ID_FILE.exec(name)?.[1];
  if (definition.id !== expected) {
    throw new Error(
      `measure set ${name} declares the id "${definition.id}"; the file must be named ${definition.id}.json`,
    );
  }
  return versionOf(definition);
}

/** A stored row as a version (its definition validated again, against today's schema). */
function decodeRow(row: MeasureSetRow): MeasureSetVersion {
  try {
    return versionOf(parseMeasureSet(JSON.parse(row.definition)));
  } catch (error) {
    throw new Error(`measure set ${row.id} as stored cannot be read: ${(error as Error).message}`, {
      cause: error,
    });
  }
}

const facts = (row: MeasureSetRow) => ({ regionId: row.region_id, status: row.status });
type Who = Pick<Actor, 'role' | 'regionId'>;

@Injectable()
export class MeasureSetsService implements OnModuleInit {
  private readonly folder: string;
  /** Published versions by id: immutable, so never stale. */
  private readonly versions = new Map<string, MeasureSetVersion>();

  constructor(
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(MeasureSetRepository) private readonly repository: MeasureSetRepository,
    @Inject(MeasureSetUsage) private readonly usage: MeasureSetUsage,
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
  ) {
    this.folder = join(findRepoRoot(), MEASURE_SET_FOLDER);
  }

  /** Seeds the shipped versions; a broken or changed file stops the start, naming it. */
  async onModuleInit(): Promise<void> {
    await this.seedFromFiles();
  }

  /** Inserts each file's version once; refuses a file that differs from the version stored. */
  async seedFromFiles(): Promise<void> {
    const files = (await readdir(this.folder)).filter((f) => ID_FILE.test(f)).sort();
    for (const file of files) {
      const path = join(this.folder, file);
      const version = decodeMeasureSet(path, await readFile(path, 'utf8'));
      const definition = canonicalJson(version.definition);
      const hash = contentHash(definition);
      const seedFile = `${MEASURE_SET_FOLDER}/${file}`;
      await this.repository.seed({
        id: version.id,
        label: version.label,
        definition,
        contentHash: hash,
        seedFile,
      });
      const stored = await this.repository.find(version.id);
      if (!stored || stored.region_id !== null || stored.status !== 'published') {
        throw new Error(
          `measure set ${seedFile}: the id "${version.id}" is already used by ${
            stored
              ? `a ${stored.status} version${stored.region_id === null ? '' : ` of region ${stored.region_id}`}`
              : 'nothing'
          } in the database; give the file another version id`,
        );
      }
      if (stored.content_hash !== hash) {
        throw new Error(
          `measure set ${seedFile} differs from the published version "${version.id}" stored in the ` +
            `database (stored SHA-256 ${stored.content_hash}, file ${hash}). A published version never ` +
            `changes: restore the file, or give the changed measure set a new version id (a new file).`,
        );
      }
    }
  }

  /** The id new audit quarters get when none is chosen. */
  defaultId(): string {
    return this.config.get('quarters', { infer: true }).defaultMeasureSetId;
  }

  /** Ids of every published version, sorted. */
  async ids(): Promise<string[]> {
    return this.repository.publishedIds();
  }

  /** Every published version, sorted by id. */
  async list(): Promise<MeasureSetVersion[]> {
    const versions: MeasureSetVersion[] = [];
    for (const id of await this.ids()) {
      const version = await this.find(id);
      if (version) versions.push(version);
    }
    return versions;
  }

  /** One published version, or null when there is none under this id. */
  async find(id: string): Promise<MeasureSetVersion | null> {
    const cached = this.versions.get(id);
    if (cached) return cached;
    const row = await this.repository.find(id);
    if (!row || row.status !== 'published') return null;
    const version = decodeRow(row);
    this.versions.set(id, version);
    return version;
  }

  /** One published version; 404 problem details naming the known ones otherwise. */
  async get(id: string): Promise<MeasureSetVersion> {
    const version = await this.find(id);
    if (version) return version;
    const known = await this.ids();
    throw new ProblemException(
      HttpStatus.NOT_FOUND,
      'measure-set-not-found',
      'No such measure set',
      `Cairn has no measure set "${id}". Known versions: ${known.join(', ') || 'none'}.`,
      { measureSetId: id, knownMeasureSets: known },
    );
  }

  /**
   * Refuses, with 422 problem details naming the field, a measure-set id that
   * is not a published version this region reads (an audit quarter uses only
   * those).
   */
  async assertUsable(
    regionId: number,
    id: string,
    field: string,
    given: boolean,
  ): Promise<MeasureSetVersion> {
    const row = await this.repository.find(id);
    const readable = row !== null && mayRead({ role: 'regional_lead', regionId }, facts(row));
    if (row && readable && row.status === 'published') return (await this.find(id))!;
    const known = (await this.repository.ofRegion(regionId))
      .filter((r) => r.status === 'published')
      .map((r) => r.id);
    const choose = `Choose one of: ${known.join(', ') || 'none'}.`;
    const draft = readable && row?.status === 'draft';
    const message = draft
      ? 'is a draft: publish it before an audit quarter uses it'
      : given
        ? `is not a measure set Cairn knows (known: ${known.join(', ') || 'none'})`
        : `was not given, and this deployment's default (quarters.defaultMeasureSetId, "${id}") is not a measure set Cairn knows (known: ${known.join(', ') || 'none'})`;
    throw new ProblemException(
      HttpStatus.UNPROCESSABLE_ENTITY,
      draft ? 'measure-set-draft' : 'unknown-measure-set',
      draft ? 'This measure set is a draft' : 'Unknown measure set',
      draft
        ? `The measure set "${id}" is still a draft. Publish it first, or ${choose.toLowerCase()}`
        : given
          ? `The measure set "${id}" is not one Cairn knows. ${choose}`
          : `No measure set was chosen, and the default "${id}" is not one Cairn knows. ${choose}`,
      { errors: [{ field, message }], measureSetId: id, knownMeasureSets: known },
    );
  }

  // ── what the routes answer ──

  /** The versions the caller reads, with where each is used and what they may do. */
  async summaries(actor: Who): Promise<MeasureSetSummaryDto[]> {
    const rows = (await this.repository.ofRegion(actor.regionId)).filter((r) =>
      mayRead(actor, facts(r)),
    );
    const uses = await this.usage.of(
      actor.regionId,
      rows.map((r) => r.id),
    );
    const summaries: MeasureSetSummaryDto[] = [];
    for (const row of rows) {
      const version = await this.versionOfRow(row);
      summaries.push(
        toMeasureSetSummary(version, {
          row,
          defaultId: this.defaultId(),
          usedBy: uses.get(row.id) ?? [],
          actions: measureSetActions(actor, facts(row)),
        }),
      );
    }
    return summaries;
  }

  /** One version the caller reads, every measure described; 404 otherwise. */
  async detail(actor: Who, id: string): Promise<MeasureSetDto> {
    const row = await this.readable(actor, id);
    const version = await this.versionOfRow(row);
    const actions = measureSetActions(actor, facts(row));
    const suggestedDraftId = actions.clone ? await this.suggestDraftId(row.id) : null;
    return toMeasureSetDto(version, {
      row,
      defaultId: this.defaultId(),
      usedBy: (await this.usage.of(actor.regionId, [row.id])).get(row.id) ?? [],
      actions,
      suggestedDraftId,
      suggestedDraftLabel:
        suggestedDraftId === null ? null : suggestLabel(row.label, row.id, suggestedDraftId),
    });
  }

  /** The differences between a version and the one it was started from. */
  async changes(actor: Who, id: string): Promise<MeasureSetChangesDto> {
    const row = await this.readable(actor, id);
    const base = row.based_on ? await this.repository.find(row.based_on) : null;
    if (!base) return { id, basedOn: null, basedOnLabel: null, changes: [] };
    const to = (await this.versionOfRow(row)).definition;
    const from = (await this.versionOfRow(base)).definition;
    return {
      id,
      basedOn: base.id,
      basedOnLabel: base.label,
      changes: measureSetChanges(from, to),
    };
  }

  /** Starts a draft from a published version (regional lead). */
  async clone(actor: Actor, sourceId: string, input: CloneMeasureSetDto): Promise<MeasureSetDto> {
    const source = await this.readable(actor, sourceId);
    if (source.status !== 'published' || !mayStartDrafts(actor)) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'measure-set-not-published',
        'Only a published version can be copied',
        `"${sourceId}" is a draft. Edit it, or start a new draft from a published version.`,
        { measureSetId: sourceId },
      );
    }
    const refuseId = (message: string) =>
      new ProblemException(
        HttpStatus.UNPROCESSABLE_ENTITY,
        'measure-set-id-taken',
        'Choose another id for the draft',
        `The id "${input.id}" ${message}.`,
        { errors: [{ field: 'id', message }] },
      );
    if (await this.repository.find(input.id)) throw refuseId('is already used by another version');
    const from = (await this.versionOfRow(source)).definition;
    const parsed = safeParseMeasureSet({ ...from, id: input.id, label: input.label.trim() });
    if (!parsed.ok) throw invalid(parsed.issues);
    const definition = canonicalJson(parsed.value);
    try {
      await this.sequelize.transaction(async (transaction) => {
        await this.repository.insertDraft(
          {
            id: input.id,
            regionId: actor.regionId,
            label: parsed.value.label,
            basedOn: source.id,
            definition,
            contentHash: contentHash(definition),
            author: { userId: actor.id, name: actor.displayName },
          },
          transaction,
        );
        await this.audit.append(
          {
            action: 'measure_set.draft_started',
            summary: `Draft measure set ${input.id} started from ${source.id}`,
            actor: { id: actor.id, label: actor.label },
            regionId: actor.regionId,
            subjectType: 'measure_set',
            subjectId: input.id,
            detail: { basedOn: source.id },
            requestId: actor.requestId,
            ipAddress: actor.ipAddress,
          },
          transaction,
        );
      });
    } catch (error) {
      // Two people choosing the same new id at once: the second is told, nothing is stored.
      if (error instanceof UniqueConstraintError) {
        throw refuseId('is already used by another version');
      }
      throw error;
    }
    return this.detail(actor, input.id);
  }

  /**
   * Saves a draft's whole definition, validated by the measure-set schema:
   * an invalid one is refused with every problem and its field, and nothing
   * is stored. A draft changed by someone else since it was read is refused.
   */
  async save(actor: Actor, id: string, input: SaveMeasureSetDraftDto): Promise<MeasureSetDto> {
    const row = await this.editable(actor, id, input.revision);
    const given = input.definition as unknown as { id?: unknown };
    if (given?.id !== id) {
      throw invalid([{ path: 'id', message: `must stay "${id}": a draft keeps its id` }]);
    }
    const parsed = safeParseMeasureSet(input.definition);
    if (!parsed.ok) throw invalid(parsed.issues);
    let version: MeasureSetVersion;
    try {
      version = versionOf(parsed.value);
    } catch (error) {
      throw invalid([{ path: '(root)', message: (error as Error).message }]);
    }
    const definition = canonicalJson(version.definition);
    const before = (await this.versionOfRow(row)).definition;
    const changed = measureSetChanges(before, version.definition);
    await this.sequelize.transaction(async (transaction) => {
      const saved = await this.repository.saveDraft(
        {
          id,
          revision: input.revision,
          label: version.label,
          definition,
          contentHash: contentHash(definition),
        },
        transaction,
      );
      if (saved !== 1) throw await this.notEditable(id, input.revision);
      await this.audit.append(
        {
          action: 'measure_set.draft_saved',
          summary: `Draft measure set ${id} saved (${changed.length} ${changed.length === 1 ? 'change' : 'changes'})`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          subjectType: 'measure_set',
          subjectId: id,
          detail: {
            revision: input.revision + 1,
            changes: changed.slice(0, 50).map((c) => ({
              measure: c.measureKey,
              field: c.field,
              before: c.before,
              after: c.after,
            })),
          },
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
    });
    return this.detail(actor, id);
  }

  /** Publishes a draft as a new version, fixed for good. */
  async publish(actor: Actor, id: string, input: PublishMeasureSetDto): Promise<MeasureSetDto> {
    const row = await this.editable(actor, id, input.revision);
    const version = decodeRow(row);
    const base = row.based_on ? await this.repository.find(row.based_on) : null;
    const changed = base ? measureSetChanges(decodeRow(base).definition, version.definition) : [];
    await this.sequelize.transaction(async (transaction) => {
      const published = await this.repository.publish(
        id,
        input.revision,
        { userId: actor.id, name: actor.displayName },
        transaction,
      );
      if (published !== 1) throw await this.notEditable(id, input.revision);
      await this.audit.append(
        {
          action: 'measure_set.published',
          summary: `Measure set ${id} published${base ? ` (${changed.length} ${changed.length === 1 ? 'change' : 'changes'} from ${base.id})` : ''}`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          subjectType: 'measure_set',
          subjectId: id,
          detail: { basedOn: row.based_on, contentHash: row.content_hash, changes: changed.length },
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
    });
    return this.detail(actor, id);
  }

  /** Discards a draft (nothing uses a draft). */
  async discard(actor: Actor, id: string): Promise<DiscardedMeasureSetDto> {
    const row = await this.readable(actor, id);
    if (!measureSetActions(actor, facts(row)).discard) throw await this.notEditable(id, null);
    await this.sequelize.transaction(async (transaction) => {
      if ((await this.repository.discard(id, transaction)) !== 1) {
        throw await this.notEditable(id, null);
      }
      await this.audit.append(
        {
          action: 'measure_set.draft_discarded',
          summary: `Draft measure set ${id} discarded`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          subjectType: 'measure_set',
          subjectId: id,
          detail: { basedOn: row.based_on, revision: row.revision },
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
    });
    return { id, basedOn: row.based_on };
  }

  // ── steps ──

  private async versionOfRow(row: MeasureSetRow): Promise<MeasureSetVersion> {
    if (row.status === 'published') return (await this.find(row.id)) ?? decodeRow(row);
    return decodeRow(row);
  }

  /** The row, if the caller may read it; 404 otherwise (another region's versions do not exist for them). */
  private async readable(actor: Who, id: string): Promise<MeasureSetRow> {
    const row = await this.repository.find(id);
    if (row && mayRead(actor, facts(row))) return row;
    const known = (await this.repository.ofRegion(actor.regionId))
      .filter((r) => mayRead(actor, facts(r)))
      .map((r) => r.id);
    throw new ProblemException(
      HttpStatus.NOT_FOUND,
      'measure-set-not-found',
      'No such measure set',
      `Cairn has no measure set "${id}". Known versions: ${known.join(', ') || 'none'}.`,
      { measureSetId: id, knownMeasureSets: known },
    );
  }

  /** The draft, if the caller may change it and it is still at `revision`. */
  private async editable(actor: Actor, id: string, revision: number): Promise<MeasureSetRow> {
    const row = await this.readable(actor, id);
    if (!measureSetActions(actor, facts(row)).edit || row.revision !== revision) {
      throw await this.notEditable(id, revision);
    }
    return row;
  }

  /** Why a draft could not be changed, read again (it may have just changed). */
  private async notEditable(id: string, revision: number | null): Promise<ProblemException> {
    const row = await this.repository.find(id);
    if (!row) {
      return new ProblemException(
        HttpStatus.NOT_FOUND,
        'measure-set-not-found',
        'No such measure set',
        `The draft "${id}" no longer exists: it was discarded.`,
        { measureSetId: id },
      );
    }
    if (row.status === 'published') {
      return new ProblemException(
        HttpStatus.CONFLICT,
        'measure-set-published',
        'A published measure set never changes',
        `"${id}" is published${row.published_by ? ` (by ${row.published_by})` : ''}: every quarter and report that uses it keeps it as it is. Start a new draft from it to make changes.`,
        { measureSetId: id },
      );
    }
    if (revision !== null && row.revision !== revision) {
      return new ProblemException(
        HttpStatus.CONFLICT,
        'measure-set-draft-changed',
        'The draft was changed meanwhile',
        `The draft "${id}" was saved by someone else since you read it (it is now at revision ${row.revision}, you read revision ${revision}). Reload it and make your change again.`,
        { measureSetId: id, revision: row.revision },
      );
    }
    return new ProblemException(
      HttpStatus.FORBIDDEN,
      'measure-set-not-yours',
      'You cannot change this draft',
      `The draft "${id}" belongs to another region, or your role cannot change measure sets.`,
      { measureSetId: id },
    );
  }

  /** The next free id after `id`'s own version number, e.g. cairn-default-2026.1 → …2026.2. */
  private async suggestDraftId(id: string): Promise<string | null> {
    const match = VERSIONED_ID.exec(id);
    if (!match) return null;
    const prefix = match[1]!;
    const taken = (await this.repository.idsStartingWith(prefix))
      .map((other) => VERSIONED_ID.exec(other))
      .filter((m): m is RegExpExecArray => m !== null && m[1] === prefix)
      .map((m) => Number(m[2]));
    const next = Math.max(Number(match[2]), ...taken) + 1;
    return `${prefix}${next}`;
  }
}

/** A label for a draft: the source's, with its version number replaced when it shows one. */
function suggestLabel(label: string, fromId: string, toId: string): string {
  const fromVersion = /(\d{4}\.\d+)$/.exec(fromId)?.[1];
  const toVersion = /(\d{4}\.\d+)$/.exec(toId)?.[1];
  if (fromVersion && toVersion && label.includes(fromVersion)) {
    return label.replace(fromVersion, toVersion);
  }
  return `${label} (draft ${toId})`.slice(0, 200);
}

/** 422 problem details listing every problem of a definition, each with its field. */
function invalid(issues: readonly { path: string; message: string }[]) {
  const errors = issues.map((i) => ({
    field: i.path === '(root)' ? 'definition' : `definition.${i.path}`,
    message: i.message,
  }));
  const first = errors[0]!;
  return new ProblemException(
    HttpStatus.UNPROCESSABLE_ENTITY,
    'invalid-measure-set',
    'The measure set is not valid',
    `${errors.length === 1 ? 'One problem' : `${errors.length} problems`}, nothing was saved: ${first.field} ${first.message}${errors.length > 1 ? ', …' : '.'}`,
    { errors },
  );
}
