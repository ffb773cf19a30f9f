/**
 * The owner of regions, localities and practices: every other module reads
 * them through this service (never through the models or raw SQL).
 */
import { Inject, Injectable } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { selectRows } from '../database/raw-select.js';
import { version } from '../version.js';
import type { AboutDto } from './dto/about.dto.js';
import type { PracticeDto, PracticeRefDto } from './dto/practice.dto.js';
import { Locality } from './models/locality.model.js';
import { Practice } from './models/practice.model.js';
import { Region } from './models/region.model.js';

export const CLINICAL_CAUTION =
  'Cairn supports clinical audit and quality improvement. It is not clinical advice and not a decision tool for individual care: follow local guidelines and use clinical judgement.';

export interface RegionInfo {
  id: number;
  code: string;
  name: string;
}

/** What other modules need to know of a practice. */
export interface PracticeInfo extends PracticeDto {
  regionId: number;
  /** The code of its locality (null when it has none) */
  localityCode: string | null;
  active: boolean;
}

/** A locality of a region. */
export interface LocalityInfo {
  id: number;
  code: string;
  name: string;
}

const ref = (p: Practice): PracticeRefDto => ({ id: p.id, code: p.code, name: p.name });
const info = (p: Practice): PracticeInfo => ({
  ...ref(p),
  localityName: p.locality?.name ?? null,
  localityCode: p.locality?.code ?? null,
  regionId: p.regionId,
  active: p.active,
});

@Injectable()
export class OrganisationsService {
  constructor(
    @InjectModel(Region) private readonly regions: typeof Region,
    @InjectModel(Locality) private readonly localities: typeof Locality,
    @InjectModel(Practice) private readonly practices: typeof Practice,
    // The app's own connection, not a model's: a model class is shared by every app made in
    // one process (tests, the operator's commands), and points at the one made last.
    @Inject(Sequelize) private readonly sequelize: Sequelize,
  ) {}

  /** The region this deployment serves (the first one; a national deployment will choose by user). */
  async primaryRegion(transaction?: Transaction): Promise<RegionInfo | null> {
    const region = await this.regions.findOne({ order: [['id', 'ASC']], transaction });
    return region ? { id: region.id, code: region.code, name: region.name } : null;
  }

  /** Every region of the deployment, by id. */
  async allRegions(): Promise<RegionInfo[]> {
    const rows = await this.regions.findAll({ order: [['id', 'ASC']] });
    return rows.map((r) => ({ id: r.id, code: r.code, name: r.name }));
  }

  async regionByCode(code: string): Promise<RegionInfo | null> {
    const region = await this.regions.findOne({ where: { code } });
    return region ? { id: region.id, code: region.code, name: region.name } : null;
  }

  async region(id: number): Promise<RegionInfo | null> {
    const region = await this.regions.findByPk(id);
    return region ? { id: region.id, code: region.code, name: region.name } : null;
  }

  /** Public facts for the landing page: no personal or practice-level data. */
  async about(): Promise<AboutDto> {
    const region = await this.primaryRegion();
    return {
      product: 'Cairn',
      version,
      regionName: region?.name ?? null,
      practices: region
        ? await this.practices.count({ where: { regionId: region.id, active: true } })
        : 0,
      localities: region ? await this.localities.count({ where: { regionId: region.id } }) : 0,
      clinicalCaution: CLINICAL_CAUTION,
    };
  }

  async practice(id: number, transaction?: Transaction): Promise<PracticeInfo | null> {
    if (!Number.isSafeInteger(id)) return null;
    const practice = await this.practices.findByPk(id, { include: [Locality], transaction });
    return practice ? info(practice) : null;
  }

  /** The practice's id, region and code only (access checks on every request; null when unknown). */
  async practiceRegion(id: number): Promise<{ id: number; regionId: number; code: string } | null> {
    if (!Number.isSafeInteger(id)) return null;
    // Read by the access guard on every practice route: one SELECT, no model instance.
    const [row] = await selectRows<{ id: number; region_id: number; code: string }>(
      this.sequelize,
      'SELECT id, region_id, code FROM practices WHERE id = ?',
      [id],
    );
    return row ? { id: Number(row.id), regionId: Number(row.region_id), code: row.code } : null;
  }

  /** These practices (any region), by code; unknown ids are left out. */
  async practiceRefs(ids: readonly number[], transaction?: Transaction): Promise<PracticeRefDto[]> {
    if (ids.length === 0) return [];
    const rows = await this.practices.findAll({
      where: { id: [...new Set(ids)] },
      order: [['code', 'ASC']],
      transaction,
    });
    return rows.map(ref);
  }

  /** A region's practices by code (only the active ones unless asked), with their localities. */
  async regionPractices(
    regionId: number,
    options: { activeOnly?: boolean; ids?: readonly number[]; transaction?: Transaction } = {},
  ): Promise<PracticeInfo[]> {
    if (options.ids && options.ids.length === 0) return [];
    // Plain rows, not model instances: a national region has thousands of practices.
    const rows = await this.sequelize.query<{
      id: number;
      code: string;
      name: string;
      region_id: number;
      active: number | boolean;
      locality_name: string | null;
      locality_code: string | null;
    }>(
      `SELECT p.id, p.code, p.name, p.region_id, p.active, l.name AS locality_name, l.code AS locality_code
         FROM practices p LEFT JOIN localities l ON l.id = p.locality_id
        WHERE p.region_id = ?${options.activeOnly ? ' AND p.active = 1' : ''}${options.ids ? ' AND p.id IN (?)' : ''}
        ORDER BY p.code ASC`,
      {
        replacements: options.ids ? [regionId, [...new Set(options.ids)]] : [regionId],
        type: QueryTypes.SELECT,
        transaction: options.transaction,
      },
    );
    return rows.map((r) => ({
      id: Number(r.id),
      code: r.code,
      name: r.name,
      localityName: r.locality_name,
      localityCode: r.locality_code,
      regionId: Number(r.region_id),
      active: Boolean(Number(r.active)),
    }));
  }

  /**
   * A fingerprint of a region's practices and localities as they are now (their count, latest
   * change and a checksum of what other modules show of them), read in one SELECT: answers
   * built from them are keyed by it, so a renamed, moved or deactivated practice is a new key.
   */
  async regionFingerprint(regionId: number): Promise<string> {
    const [row] = await selectRows<{ fingerprint: string }>(
      this.sequelize,
      `SELECT ${this.regionFingerprintSql('?')} AS fingerprint`,
      [regionId, regionId],
    );
    return row?.fingerprint ?? ';';
  }

  /**
   * SQL of `regionFingerprint` for a read that embeds it: `regionIdSql` is SQL written by the
   * caller's code (a column, or a `?` placeholder), never a request's value; it appears twice.
   */
  regionFingerprintSql(regionIdSql: string): string {
    return `CONCAT(
      (SELECT CONCAT(COUNT(*), '/', COALESCE(MAX(updated_at), ''), '/',
                     COALESCE(SUM(CRC32(CONCAT_WS('|', id, code, name, active, COALESCE(locality_id, '')))), 0))
         FROM practices WHERE region_id = ${regionIdSql}), ';',
      (SELECT CONCAT(COUNT(*), '/', COALESCE(MAX(updated_at), ''), '/',
                     COALESCE(SUM(CRC32(CONCAT_WS('|', id, code, name))), 0))
         FROM localities WHERE region_id = ${regionIdSql}))`;
  }

  /** A region's localities, by code. */
  async regionLocalities(regionId: number): Promise<LocalityInfo[]> {
    const rows = await this.localities.findAll({ where: { regionId }, order: [['code', 'ASC']] });
    return rows.map((l) => ({ id: l.id, code: l.code, name: l.name }));
  }

  /** The practices of a region with these codes; unknown codes are left out. */
  async practicesByCode(
    regionId: number,
    codes: readonly string[],
    transaction?: Transaction,
  ): Promise<PracticeRefDto[]> {
    if (codes.length === 0) return [];
    const rows = await this.practices.findAll({
      where: { regionId, code: { [Op.in]: [...new Set(codes)] } },
      order: [['code', 'ASC']],
      transaction,
    });
    return rows.map(ref);
  }
}
