/** The upload page, with the practice and audit quarter chosen. */
export function uploadLink(practiceId?: number, quarterId?: number): string {
  const params = new URLSearchParams();
  if (practiceId) params.set('practice', String(practiceId));
  if (quarterId) params.set('quarter', String(quarterId));
  const text = params.toString();
  return `/extracts/upload${text ? `?${text}` : ''}`;
}
