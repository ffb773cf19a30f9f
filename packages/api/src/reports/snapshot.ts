/**
 * A report's snapshot: everything its pages, data packs and PDFs show, frozen
 * when it is published. Stored as canonical JSON (object keys sorted, no
 * white space; the same value always gives the same bytes) compressed with
 * gzip; its identity is the SHA-256 of the canonical bytes, which include who
 * published it, when and the release note. Readers get the figures from these
 * bytes only, never from the quarter's current submissions.
 *
 * What is the same for every practice is stored once: a practice's peer
 * tables (its own row in full, the others protected) are made on reading
 * from the region's counts of every practice (`practicePeers`, by the same
 * disclosure rule as at publishing), and a practice's results keep the split
 * the report shows (everyone; the region's part holds all three). Format 1
 * snapshots stored the peer tables per practice and are read as stored.
 */
import { createHash } from 'node:crypto';
import { gunzipSync, gzipSync } from 'node:zlib';
import { canonicalJson } from '../measure-sets/canonical.js';
import { nameComponents } from '../measure-sets/describe.js';
import type {
  BenchmarkTrendDto,
  MeasureFunnelDto,
  RegionBenchmarkDto,
} from '../benchmarks/dto/benchmark.dto.js';
import type { PracticeResultsWithDetailDto } from '../benchmarks/dto/practice-results.dto.js';
import type { PracticeDto } from '../organisations/dto/practice.dto.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import type { DisclosedCellDto, PeerTableDto } from './dto/report.dto.js';
import { type PeerCounts, practicePeerTable } from './peer-table.js';

/** Bumped when the snapshot's shape changes; old snapshots keep their own. */
export const SNAPSHOT_FORMAT = 2;

export interface SnapshotIdentity {
  regionId: number;
  quarter: QuarterDto;
  sequence: number;
  label: string;
  measureSetId: string;
  benchmarkResultId: number;
  submissionsKey: string;
  publishedAt: string;
  publishedBy: { userId: number | null; name: string };
  releaseNote: string;
}

export interface SnapshotPractice {
  practice: PracticeDto;
  submissionId: number;
  /** The practice's report as its own leads read it (region figures and peers under disclosure control) */
  results: PracticeResultsWithDetailDto;
  /** Format 1 only: each measure's peer table (format 2 makes them with `practicePeers`) */
  peers?: PeerTableDto[];
}

export interface RegionBreakdownRow {
  measure: string;
  breakdown: string;
  category: string;
  met: DisclosedCellDto;
  n: DisclosedCellDto;
  rate: number | null;
}

export interface ReportSnapshot {
  format: number;
  identity: SnapshotIdentity;
  submissions: { practiceId: number; code: string; submissionId: number }[];
  region: {
    /** all, type1, type2_other */
    splits: RegionBenchmarkDto[];
    funnels: MeasureFunnelDto[];
    /** The region's series of each measure (`practices` left empty: each practice's is in its part) */
    trends: BenchmarkTrendDto[];
    /** The region's breakdowns (everyone), each breakdown's categories × (met, not met) protected */
    breakdowns: RegionBreakdownRow[];
    /** Each measure (everyone), every practice protected */
    peerTables: PeerTableDto[];
  };
  practices: SnapshotPractice[];
  caution: string;
}

export interface EncodedSnapshot {
  /** The canonical bytes */
  canonical: Buffer;
  /** gzip of the canonical bytes, as stored */
  stored: Buffer;
  contentHash: string;
}

export const sha256Hex = (bytes: Buffer): string =>
  createHash('sha256').update(bytes).digest('hex');

export function encodeSnapshot(snapshot: ReportSnapshot): EncodedSnapshot {
  const canonical = Buffer.from(canonicalJson(snapshot), 'utf8');
  return { canonical, stored: gzipSync(canonical), contentHash: sha256Hex(canonical) };
}

/**
 * A practice's peer tables in a report, one per measure (everyone): the practice's own row in
 * full, the other practices protected (peer-table.ts), from the region's counts frozen in the
 * snapshot.
 */
export function practicePeers(snapshot: ReportSnapshot, practiceId: number): PeerTableDto[] {
  const part = snapshot.practices.find((p) => p.practice.id === practiceId);
  if (part?.peers) return part.peers;
  const all = snapshot.region.splits[0];
  if (!all || !part) return [];
  return all.measures.map((m, i) => {
    const counts: PeerCounts[] = all.practices.map((p) => ({
      practice: p.practice,
      events: p.cells[i]!.events,
      n: p.cells[i]!.n,
    }));
    const own = counts.find((c) => c.practice.id === practiceId)!;
    return practicePeerTable(
      m.key,
      'all',
      own,
      counts.filter((c) => c !== own),
    );
  });
}

/** The canonical bytes of a stored snapshot, checked against the hash published with it. */
export function canonicalBytes(stored: Buffer, contentHash: string): Buffer {
  const canonical = gunzipSync(stored);
  const actual = sha256Hex(canonical);
  if (actual !== contentHash) {
    throw new Error(`report snapshot does not match its content hash (${actual} ≠ ${contentHash})`);
  }
  return canonical;
}

/**
 * The snapshot as its readers see it. The bytes stay as published (their hash is checked
 * first); only a composite measure's guideline and note are read through `nameComponents`, so a
 * report frozen while a composite's guideline named its parts by key shows their labels, as
 * every other page does. The labels come from the snapshot's own measures.
 */
export function decodeSnapshot(canonical: Buffer): ReportSnapshot {
  const snapshot = JSON.parse(canonical.toString('utf8')) as ReportSnapshot;
  nameSnapshotComponents(snapshot);
  return snapshot;
}

interface FrozenMeasure {
  key: string;
  label: string;
  source: string;
  note?: string | null;
  components?: string[];
}

const isFrozenMeasure = (value: Record<string, unknown>): boolean =>
  typeof value.key === 'string' &&
  typeof value.label === 'string' &&
  typeof value.source === 'string';

/** Every measure (MeasureDto) held anywhere in a decoded snapshot, in place. */
export function nameSnapshotComponents(snapshot: unknown): void {
  const measures: FrozenMeasure[] = [];
  const walk = (value: unknown): void => {
    if (Array.isArray(value)) {
      for (const item of value) walk(item);
    } else if (value !== null && typeof value === 'object') {
      const record = value as Record<string, unknown>;
      if (isFrozenMeasure(record)) measures.push(record as unknown as FrozenMeasure);
      for (const child of Object.values(record)) walk(child);
    }
  };
  walk(snapshot);
  const labels = new Map(measures.map((m) => [m.key, m.label]));
  const labelOf = (key: string) => labels.get(key);
  for (const m of measures) {
    if (!Array.isArray(m.components) || m.components.length === 0) continue;
    m.source = nameComponents(m.source, m.components, labelOf);
    if (typeof m.note === 'string') m.note = nameComponents(m.note, m.components, labelOf);
  }
}
