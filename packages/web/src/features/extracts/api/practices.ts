/**
 * The practices a person may send extracts for, and for each the audit
 * quarters it may take one for: the API decides (GET /api/extracts/upload-options,
 * its upload action per practice and quarter); the web only shows it.
 */
import type { Practice, Quarter } from '../../../lib/api/types';
import { useUploadOptions } from './extracts';

export interface PracticeChoices {
  practices: Practice[];
  /** Every audit quarter of the region, latest first */
  quarters: Quarter[];
  /** The quarters an extract may be sent to for this practice */
  uploadQuarterIds: (practiceId: number) => readonly number[];
  isPending: boolean;
  error: unknown;
}

export function usePracticeChoices(): PracticeChoices {
  const options = useUploadOptions();
  const practices = options.data?.practices ?? [];
  return {
    practices: practices.map((p) => p.practice),
    quarters: options.data?.quarters ?? [],
    uploadQuarterIds: (practiceId) =>
      practices.find((p) => p.practice.id === practiceId)?.quarterIds ?? [],
    isPending: options.isPending,
    error: options.error,
  };
}

/** A practice in a list; with its locality when choosing among the region's practices. */
export const practiceLabel = (p: Practice, withLocality = false) =>
  `${p.code} · ${p.name}${withLocality && p.localityName ? ` (${p.localityName})` : ''}`;
