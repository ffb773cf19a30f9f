/**
 * Measure sets, versioned (docs/methods.md §2–3): the one place the rest of the
 * API gets them from. Every version is validated (parseMeasureSet), compiled
 * (compileMeasureSet) and described once, then kept in memory by id: a
 * version's content never changes (a change is a new version), so the cache
 * can never be stale. Today the versions are the JSON files of
 * config/measure-sets/ (file name = id); callers never read those files
 * themselves, so that the versions can move into the database behind this
 * service without any caller changing.
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
} from '@cairn/metrics';
import { ProblemException } from '../common/problem.js';
import type { CairnConfig } from '../config/config.schema.js';
import { findRepoRoot } from '../config/load-config.js';
import { describeMeasures, type MeasureView } from './describe.js';
import type { MeasureSetDto, MeasureSetSummaryDto } from './dto/measure-set.dto.js';
import { toMeasureSetDto, toMeasureSetSummary } from './measure-set-views.js';

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
  return {
    id: definition.id,
    label: definition.label,
    description: definition.description ?? null,
    definition,
    compiled: compileMeasureSet(definition),
    measures: describeMeasures(definition),
  };
}

@Injectable()
export class MeasureSetsService implements OnModuleInit {
  private readonly folder: string;
  private readonly versions = new Map<string, MeasureSetVersion>();

  constructor(@Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>) {
    this.folder = join(findRepoRoot(), MEASURE_SET_FOLDER);
  }

  /** A broken measure set stops the start, naming the file and the problem. */
  async onModuleInit(): Promise<void> {
    await this.list();
  }

  /** The id new audit quarters get when none is chosen. */
  defaultId(): string {
    return this.config.get('quarters', { infer: true }).defaultMeasureSetId;
  }

  /** Ids of every known version, sorted. */
  async ids(): Promise<string[]> {
    const files = await readdir(this.folder);
    return files
      .map((f) => ID_FILE.exec(f)?.[1])
      .filter((id): id is string => id !== undefined)
      .sort();
  }

  /** Every known version, sorted by id. */
  async list(): Promise<MeasureSetVersion[]> {
    const versions: MeasureSetVersion[] = [];
    for (const id of await this.ids()) versions.push((await this.find(id))!);
    return versions;
  }

  /** Every version, as the list route sends it. */
  async summaries(): Promise<MeasureSetSummaryDto[]> {
    const defaultId = this.defaultId();
    return (await this.list()).map((v) => toMeasureSetSummary(v, defaultId));
  }

  /** One version with every measure described; 404 when unknown. */
  async detail(id: string): Promise<MeasureSetDto> {
    return toMeasureSetDto(await this.get(id), this.defaultId());
  }

  /** One version, or null when Cairn does not know it. */
  async find(id: string): Promise<MeasureSetVersion | null> {
    const cached = this.versions.get(id);
    if (cached) return cached;
    if (!(await this.ids()).includes(id)) return null;
    const file = join(this.folder, `${id}.json`);
    const version = decodeMeasureSet(file, await readFile(file, 'utf8'));
    this.versions.set(id, version);
    return version;
  }

  /** One version; 404 problem details naming the known ones otherwise. */
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
   * Refuses an unknown measure-set id given in a request field, with 422
   * problem details naming the field and the known versions.
   */
  async assertKnown(id: string, field: string, given: boolean): Promise<MeasureSetVersion> {
    const version = await this.find(id);
    if (version) return version;
    const known = await this.ids();
    const message = given
      ? `is not a measure set Cairn knows (known: ${known.join(', ') || 'none'})`
      : `was not given, and this deployment's default (quarters.defaultMeasureSetId, "${id}") is not a measure set Cairn knows (known: ${known.join(', ') || 'none'})`;
    throw new ProblemException(
      HttpStatus.UNPROCESSABLE_ENTITY,
      'unknown-measure-set',
      'Unknown measure set',
      given
        ? `The measure set "${id}" is not one Cairn knows. Choose one of: ${known.join(', ') || 'none'}.`
        : `No measure set was chosen, and the default "${id}" is not one Cairn knows. Choose one of: ${known.join(', ') || 'none'}.`,
      { errors: [{ field, message }], measureSetId: id, knownMeasureSets: known },
    );
  }
}
