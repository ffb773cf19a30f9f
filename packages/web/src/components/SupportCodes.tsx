/**
 * The codes behind words on a screen (a refusal, an issue, an audit action), kept for support:
 * folded away, so that people read the words and can still quote the code when they ask for help.
 */
export function SupportCodes({ label, codes }: { label: string; codes: readonly string[] }) {
  const unique = [...new Set(codes)];
  if (unique.length === 0) return null;
  return (
    <details className="cairn-support-codes">
      <summary>Details for support</summary>
      {label}
      {unique.length === 1 ? '' : 's'}:{' '}
      {unique.map((code, i) => (
        <span key={code}>
          {i > 0 ? ', ' : ''}
          <code>{code}</code>
        </span>
      ))}
    </details>
  );
}
