/**
 * Where digests come from: a DigestSource names the report a digest belongs
 * to (the outbox row's source id), gives one practice's results in it as the
 * practice's leads see them (disclosure control applied), and its data pack
 * (the same file its leads download from the report's page).
 * DigestsService composes only through this interface.
 */
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';

export interface DigestReport {
  /** The outbox source id of this report's digests */
  id: number;
  regionId: number;
  quarterId: number;
  quarterLabel: string;
  /** "2026 Q3 report" */
  label: string;
  publishedAt: string;
  /** The practices with a part in the report (results or none), by id */
  practiceIds: number[];
}

export interface DataPack {
  filename: string;
  content: Buffer;
  contentType: string;
}

export interface DigestSource {
  /** What the source is, in words, for problem details and the delivery page */
  readonly noun: string;
  /** The report, if it is of the region and may be read (not withdrawn) */
  report(id: number, regionId: number): Promise<DigestReport | null>;
  /** The region's reports, latest first */
  list(regionId: number): Promise<DigestReport[]>;
  /** The practice's part of the report as its leads see it; null when it has no figures in it */
  practiceResults(report: DigestReport, practiceId: number): Promise<PracticeResultsDto | null>;
  /** Where the practice's part of the report and its recall lists are, in Cairn's web app */
  paths(report: DigestReport, practiceId: number): { report: string; recallLists: string };
  /** The practice's XLSX data pack of the report, as its leads download it */
  dataPack(report: DigestReport, practiceId: number): Promise<DataPack>;
}

export const DIGEST_SOURCE = Symbol('DigestSource');
