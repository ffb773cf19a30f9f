import { Injectable } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import { Locality } from './models/locality.model.js';
import { Practice } from './models/practice.model.js';
import { Region } from './models/region.model.js';

@Injectable()
export class OrganisationsService {
  constructor(
    @InjectModel(Region) private readonly regions: typeof Region,
    @InjectModel(Locality) private readonly localities: typeof Locality,
    @InjectModel(Practice) private readonly practices: typeof Practice,
  ) {}

  /** The region this deployment serves (the first one; a national deployment will choose by user). */
  async primaryRegion(): Promise<Region | null> {
    return this.regions.findOne({ order: [['id', 'ASC']] });
  }

  async practiceCount(regionId: number): Promise<number> {
    return this.practices.count({ where: { regionId, active: true } });
  }

  async localityCount(regionId: number): Promise<number> {
    return this.localities.count({ where: { regionId } });
  }
}
