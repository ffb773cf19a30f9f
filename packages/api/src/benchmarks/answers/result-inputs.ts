/**
 * What a results route's answer depends on, read in one statement per request:
 * the region's quarters, each quarter's current-set row and the fingerprint of
 * the region's practices and localities. Each is its owner's SQL (quarters,
 * submissions, organisations), embedded in the quarters' read, so the key of
 * a stored answer (StoredAnswers) costs one round trip, and nothing of it is
 * kept in this process: every request reads what is current now.
 */
import { Inject, Injectable } from '@nestjs/common';
import { OrganisationsService } from '../../organisations/organisations.service.js';
import type { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import { QuartersService } from '../../quarters/quarters.service.js';
import { type CurrentSetRow, SubmissionsService } from '../../submissions/submissions.service.js';

/** A region's results inputs as read now. */
export interface RegionInputs {
  /** The region's quarters, newest first */
  quarters: QuarterDto[];
  /** The region's fingerprint (OrganisationsService.regionFingerprint) */
  fingerprint: string;
  /** The current set of each of these quarters (null: no current submission) */
  setsOf(quarters: readonly QuarterDto[]): Promise<Map<number, CurrentSetRow | null>>;
}

@Injectable()
export class ResultInputs {
  constructor(
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
  ) {}

  /** The region's quarters, their current-set rows and the region's fingerprint, in one SELECT. */
  async of(regionId: number): Promise<RegionInputs> {
    const read = await this.quarters.listWith(regionId, {
      perQuarter: { currentSet: (q) => this.submissions.currentSetSql(q) },
      perRegion: { fingerprint: (r) => this.organisations.regionFingerprintSql(r) },
    });
    return {
      quarters: read.quarters,
      fingerprint: String(read.perRegion.fingerprint ?? ';'),
      setsOf: async (quarters) => {
        const rows = await this.submissions.currentSetRowsOf(
          new Map(quarters.map((q) => [q.id, read.perQuarter.get(q.id)?.currentSet ?? null])),
        );
        return new Map(
          quarters.map((q) => {
            const set = rows.get(q.id);
            return [q.id, set && set.count > 0 ? set : null];
          }),
        );
      },
    };
  }
}
