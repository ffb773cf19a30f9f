/**
 * Where measure-set versions are used. The modules that use a version (audit
 * quarters today, published reports later) come after this one in the data
 * flow, so they register a source here instead of this module reading their
 * tables: each answers for its own rows.
 */
import { Injectable } from '@nestjs/common';
import type { MeasureSetUseDto } from './dto/measure-set.dto.js';

export interface MeasureSetUseSource {
  /** The uses of these versions in a region, by version id. */
  usesOf(
    regionId: number,
    measureSetIds: readonly string[],
  ): Promise<Map<string, MeasureSetUseDto[]>>;
}

@Injectable()
export class MeasureSetUsage {
  private readonly sources: MeasureSetUseSource[] = [];

  register(source: MeasureSetUseSource): void {
    this.sources.push(source);
  }

  async of(regionId: number, ids: readonly string[]): Promise<Map<string, MeasureSetUseDto[]>> {
    const all = new Map<string, MeasureSetUseDto[]>(ids.map((id) => [id, []]));
    if (ids.length === 0) return all;
    for (const source of this.sources) {
      for (const [id, uses] of await source.usesOf(regionId, ids)) {
        all.get(id)?.push(...uses);
      }
    }
    return all;
  }
}
