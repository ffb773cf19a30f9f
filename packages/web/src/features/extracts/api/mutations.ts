/**
 * The writes of extracts: upload, and the three decisions on a submission
 * (confirm, cancel, retry). Each refreshes what it changed, by key.
 */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError, apiFetch } from '../../../lib/api-client';
import type { DateConvention, Submission, UploadProblem } from '../../../lib/api/types';
import { extractsKeys } from './extracts';

export interface ExtractUpload {
  practiceId: number;
  quarterId: number;
  file: File;
  dateConvention: DateConvention | null;
}

/** POST the file as multipart (part "file"); answers 202 with the new submission, processing. */
export function uploadExtract({
  practiceId,
  quarterId,
  file,
  dateConvention,
}: ExtractUpload): Promise<Submission> {
  const body = new FormData();
  body.append('file', file, file.name);
  const query = dateConvention ? `?dateConvention=${dateConvention}` : '';
  return apiFetch<Submission>(
    `/api/practices/${practiceId}/quarters/${quarterId}/extracts${query}`,
    {
      method: 'POST',
      body,
    },
  );
}

async function refreshAfterChange(
  client: ReturnType<typeof useQueryClient>,
  practiceId: number,
): Promise<void> {
  await Promise.all([
    client.invalidateQueries({ queryKey: extractsKeys.practice(practiceId) }),
    client.invalidateQueries({ queryKey: extractsKeys.coverageAll() }),
    client.invalidateQueries({ queryKey: ['audit-events'] }),
  ]);
}

export function useUploadExtract() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: uploadExtract,
    onSuccess: async (submission, upload) => {
      client.setQueryData(extractsKeys.submission(upload.practiceId, submission.id), submission);
      await refreshAfterChange(client, upload.practiceId);
    },
    onError: async (error, upload) => {
      // A file over the size limit is kept as a rejected submission, so the history changed.
      if (error instanceof ApiError && typeof error.problem.submissionId === 'number')
        await refreshAfterChange(client, upload.practiceId);
    },
  });
}

export type SubmissionDecision = 'confirm' | 'cancel' | 'retry';

export function useSubmissionDecision(practiceId: number, submissionId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (decision: SubmissionDecision) =>
      apiFetch<Submission>(`/api/practices/${practiceId}/submissions/${submissionId}/${decision}`, {
        method: 'POST',
      }),
    onSuccess: async (submission) => {
      client.setQueryData(extractsKeys.submission(practiceId, submissionId), submission);
      await refreshAfterChange(client, practiceId);
    },
  });
}

/** The upload route's refusals (identical file, too large) carry the UploadProblem extensions. */
export function uploadProblemOf(error: unknown): UploadProblem | null {
  return error instanceof ApiError ? (error.problem as UploadProblem) : null;
}

/** Cancels several submissions of a practice, one after the other (older extracts left waiting). */
export function useCancelSubmissions(practiceId: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (submissionIds: readonly number[]) => {
      const cancelled: Submission[] = [];
      for (const id of submissionIds) {
        cancelled.push(
          await apiFetch<Submission>(`/api/practices/${practiceId}/submissions/${id}/cancel`, {
            method: 'POST',
          }),
        );
      }
      return cancelled;
    },
    onSettled: async () => {
      await refreshAfterChange(client, practiceId);
    },
  });
}
