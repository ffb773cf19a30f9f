/**
 * Which reports get a sending of their own (DigestsService.scheduleNewReports), without a
 * database: regions, quarters, their reports and the schedules table are plain objects. Every
 * region is looked at, whether or not it has an open quarter and whether or not it comes first.
 */
import type { QuarterReportDto } from '../quarters/dto/quarter.dto.js';
import { DigestsService } from './digests.service.js';

const NOW = new Date('2026-12-04T10:00:00Z');
const minutesAgo = (m: number) => new Date(NOW.getTime() - m * 60_000).toISOString();
const AFTER_MINUTES = 60;

/** Invented regions, each with its quarters and those quarters' reports. */
interface World {
  regions: { id: number; code: string; name: string }[];
  quarters: Map<number, { id: number; status: 'open' | 'closed' }[]>;
  reports: Map<number, QuarterReportDto[]>;
  scheduled: Map<number, { regionId: number; sendAt: Date; label: string }>;
}

function service(world: World): DigestsService {
  const organisations = {
    allRegions: async () => world.regions,
    primaryRegion: async () => world.regions[0] ?? null,
  };
  const quarters = {
    list: async (regionId: number) => world.quarters.get(regionId) ?? [],
    openQuarters: async () =>
      [...world.quarters.entries()].flatMap(([regionId, qs]) =>
        qs.filter((q) => q.status === 'open').map((q) => ({ ...q, regionId })),
      ),
  };
  const quarterReports = {
    of: async (_regionId: number, ids: readonly number[]) =>
      new Map(ids.map((id) => [id, world.reports.get(id) ?? []])),
  };
  const schedules = {
    find: async (sourceId: number) => world.scheduled.get(sourceId) ?? null,
    schedule: async (
      sourceId: number,
      regionId: number,
      sendAt: Date,
      by: { userId: number | null; label: string },
    ) => {
      world.scheduled.set(sourceId, { regionId, sendAt, label: by.label });
      return true;
    },
  };
  const config = {
    get: () => ({ digests: { afterPublicationMinutes: AFTER_MINUTES } }),
  };
  const unused = {} as never;
  return new DigestsService(
    unused, // source
    unused, // review cases
    unused, // composers
    unused, // outbox
    unused, // recipients
    organisations as never,
    quarters as never,
    quarterReports as never,
    unused, // transport
    schedules as never,
    unused, // audit trail
    unused, // scheduler
    config as never,
  );
}

const report = (
  id: number,
  status: QuarterReportDto['status'],
  publishedAt: string,
): QuarterReportDto => ({ id, label: `report ${id}`, status, publishedAt });

describe('scheduling the digests of newly published reports', () => {
  it('schedules a new report in every region, with or without an open quarter, once', async () => {
    const world: World = {
      regions: [
        { id: 1, code: 'AAA', name: 'First region' },
        { id: 2, code: 'BBB', name: 'Second region' },
        { id: 3, code: 'CCC', name: 'Third region' },
      ],
      quarters: new Map([
        [1, [{ id: 11, status: 'open' }]],
        // Neither the first region nor one with an open quarter: its reports count as well.
        [2, [{ id: 21, status: 'closed' }]],
        [3, [{ id: 31, status: 'closed' }]],
      ]),
      reports: new Map([
        [11, [report(101, 'published', minutesAgo(5))]],
        [
          21,
          [
            report(202, 'published', minutesAgo(10)),
            report(201, 'replaced', minutesAgo(90)),
            report(200, 'withdrawn', minutesAgo(100)),
          ],
        ],
        // Published more than a week ago: left to the regional lead.
        [31, [report(301, 'published', minutesAgo(8 * 24 * 60))]],
      ]),
      scheduled: new Map(),
    };
    const digests = service(world);
    expect(await digests.scheduleNewReports(NOW)).toBe(2);
    expect([...world.scheduled.keys()].sort()).toEqual([101, 202]);
    expect(world.scheduled.get(202)).toEqual({
      regionId: 2,
      sendAt: new Date(Date.parse(minutesAgo(10)) + AFTER_MINUTES * 60_000),
      label: 'on publication',
    });
    // Scheduled (or moved, or cancelled) before: left alone.
    expect(await digests.scheduleNewReports(NOW)).toBe(0);
  });

  it('finds a report published in a region whose only quarter was closed before publication', async () => {
    const world: World = {
      regions: [
        { id: 1, code: 'AAA', name: 'First region' },
        { id: 5, code: 'EEE', name: 'Fifth region' },
      ],
      quarters: new Map([[5, [{ id: 51, status: 'closed' }]]]),
      reports: new Map([[51, [report(501, 'published', minutesAgo(1))]]]),
      scheduled: new Map(),
    };
    expect(await service(world).scheduleNewReports(NOW)).toBe(1);
    expect(world.scheduled.get(501)?.regionId).toBe(5);
  });
});
