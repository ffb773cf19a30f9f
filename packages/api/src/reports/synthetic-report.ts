/**
 * A synthetic report of many practices, for the data-pack benchmark
 * (bench/reports.ts): deterministic invented counts, 17 measures, every sheet
 * of the region's pack filled as a real report fills it. Nothing here is
 * shown to anyone.
 */
import type { DisclosedCellDto, PeerRowDto, PeerTableDto } from './dto/report.dto.js';
import type { ReportRow } from './report.repository.js';
import type { RegionBreakdownRow, ReportSnapshot } from './snapshot.js';

const MEASURES = 17;
const QUARTERS = 8;

/** A deterministic pseudo-random sequence (mulberry32). */
function random(seed: number) {
  let a = seed;
  return () => {
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const shown = (value: number): DisclosedCellDto => ({
  value,
  display: String(value),
  suppression: 'none',
});
const small = (value: number): DisclosedCellDto =>
  value > 0 && value < 5 ? { value: null, display: '< 5', suppression: 'primary' } : shown(value);

export function syntheticReport(practices: number): { row: ReportRow; snapshot: ReportSnapshot } {
  const next = random(20261203);
  const measures = Array.from({ length: MEASURES }, (_, m) => ({
    key: `measure_${m + 1}`,
    label: `Synthetic measure ${m + 1}`,
    kind: m < 9 ? 'care_process' : 'treatment_target',
    composite: false,
    definition: 'Invented for the benchmark',
    denominator: 'eligible',
    denominatorText: 'Everyone eligible',
    direction: 'higher',
    source: 'Invented for the benchmark',
    note: null,
  }));
  const list = Array.from({ length: practices }, (_, i) => ({
    id: i + 1,
    code: `SY${String(i + 1).padStart(5, '0')}`,
    name: `Synthetic practice ${i + 1}`,
    localityName: `Locality ${(i % 40) + 1}`,
  }));
  const peerTables: PeerTableDto[] = measures.map((m) => {
    const rows: PeerRowDto[] = list.map((practice) => {
      const n = Math.floor(next() * 400);
      const met = Math.floor(next() * (n + 1));
      return {
        practice,
        own: false,
        met: small(met),
        notMet: small(n - met),
        n: small(n),
        rate: n >= 10 && met >= 5 && n - met >= 5 ? met / n : null,
      };
    });
    const met = rows.reduce((s, r) => s + (r.met.value ?? 2), 0);
    const n = rows.reduce((s, r) => s + (r.n.value ?? 2), 0);
    return {
      measure: m.key,
      split: 'all',
      rows,
      met: shown(met),
      notMet: shown(n - met),
      n: shown(n),
      rate: met / n,
      withheld: false,
    };
  });
  const limits = (rate: number, width: number) => ({
    lower: Math.max(0, rate - width),
    upper: Math.min(1, rate + width),
  });
  const funnels = measures.map((m, mi) => ({
    measure: m,
    region: { theta0: peerTables[mi]!.rate, median: 0.5 },
    points: peerTables[mi]!.rows.map((r) => {
      const n = r.n.value ?? 3;
      const rate = r.rate ?? 0.5;
      return {
        practice: r.practice,
        n,
        events: Math.round(rate * n),
        rate,
        exact: {
          band: 'within',
          side: null,
          assessment: null,
          inner: limits(0.5, 2 / Math.sqrt(n + 1)),
          outer: limits(0.5, 3 / Math.sqrt(n + 1)),
        },
      };
    }),
  }));
  const trends = measures.map((m) => ({
    measure: m,
    quarters: Array.from({ length: QUARTERS }, (_, q) => ({
      quarterLabel: `20${24 + Math.floor(q / 4)} Q${(q % 4) + 1}`,
    })),
    region: {
      points: Array.from({ length: QUARTERS }, () => {
        const n = 100_000 + Math.floor(next() * 1000);
        const events = Math.floor(n * next());
        return { state: 'value', events, n, rate: events / n };
      }),
    },
    practices: [],
  }));
  const breakdowns: RegionBreakdownRow[] = measures.flatMap((m) =>
    ['age_band', 'sex', 'deprivation', 'duration'].flatMap((b) =>
      [1, 2, 3, 4, 5].map((c) => {
        const n = Math.floor(next() * 50_000);
        const met = Math.floor(n * next());
        return {
          measure: m.key,
          breakdown: b,
          category: String(c),
          met: shown(met),
          n: shown(n),
          rate: met / n,
        };
      }),
    ),
  );
  const split = (name: string) => ({
    split: name,
    measures,
    region: measures.map((_, i) => ({
      measure: measures[i]!.key,
      events: peerTables[i]!.met.value!,
      n: peerTables[i]!.n.value!,
      theta0: peerTables[i]!.rate,
      median: 0.5,
      practices,
      overdispersion: { phi: 1.8 },
    })),
    practices: [],
    coverage: { missing: [] },
  });
  const snapshot = {
    format: 1,
    identity: {
      regionId: 1,
      quarter: { id: 1, label: '2026 Q3', windowStart: '2025-10', windowEnd: '2026-09' },
      sequence: 1,
      label: '2026 Q3 · report 1',
      measureSetId: 'synthetic',
      benchmarkResultId: 1,
      submissionsKey: '0'.repeat(64),
      publishedAt: '2026-12-03T12:00:00.000Z',
      publishedBy: { userId: null, name: 'Benchmark' },
      releaseNote: 'Synthetic report for the data-pack benchmark',
    },
    submissions: list.map((p) => ({ practiceId: p.id, code: p.code, submissionId: p.id })),
    region: {
      splits: [split('all'), split('type1'), split('type2_other')],
      funnels,
      trends,
      peerTables,
      breakdowns,
    },
    practices: [],
    caution: 'Synthetic',
  } as unknown as ReportSnapshot;
  const row = { id: 1, contentHash: 'f'.repeat(64) } as ReportRow;
  return { row, snapshot };
}
