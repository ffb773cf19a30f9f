/**
 * A report's snapshot: everything its pages, data packs and PDFs show, frozen
 * when it is published. Stored as canonical JSON (object keys sorted, no
 * white space; the same value always gives the same bytes) compressed with
 * gzip; its identity is the SHA-256 of the canonical bytes, which include who
 * published it, when and the release note. Readers get the figures from these
 * bytes only, never from the quarter's current submissions.
 */
import { createHash } from 'node:crypto';
import { gunzipSync, gzipSync } from 'node:zlib';
import type {
  BenchmarkTrendDto,
  MeasureFunnelDto,
  RegionBenchmarkDto,
} from '../benchmarks/dto/benchmark.dto.js';
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';
import { canonicalJson } from '../measure-sets/canonical.js';
import type { PracticeDto } from '../organisations/dto/practice.dto.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import type { PeerTableDto } from './dto/report.dto.js';

/** Bumped when the snapshot's shape changes; old snapshots keep their own. */
export const SNAPSHOT_FORMAT = 1;

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
  /** As the region's readers see it (no disclosure control) */
  full: PracticeResultsDto;
  /** As the practice's own leads see it (region figures and peers under disclosure control) */
  disclosed: PracticeResultsDto;
  /** Each measure (everyone): this practice in full, the others protected */
  peers: PeerTableDto[];
}

export interface ReportSnapshot {
  format: number;
  identity: SnapshotIdentity;
  submissions: { practiceId: number; code: string; submissionId: number }[];
  region: {
    /** all, type1, type2_other */
    splits: RegionBenchmarkDto[];
    funnels: MeasureFunnelDto[];
    trends: BenchmarkTrendDto[];
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

/** The canonical bytes of a stored snapshot, checked against the hash published with it. */
export function canonicalBytes(stored: Buffer, contentHash: string): Buffer {
  const canonical = gunzipSync(stored);
  const actual = sha256Hex(canonical);
  if (actual !== contentHash) {
    throw new Error(`report snapshot does not match its content hash (${actual} ≠ ${contentHash})`);
  }
  return canonical;
}

export function decodeSnapshot(canonical: Buffer): ReportSnapshot {
  return JSON.parse(canonical.toString('utf8')) as ReportSnapshot;
}
