import { Callout, Intent } from '@blueprintjs/core';

export const CLINICAL_CAUTION =
  'Cairn supports clinical audit and quality improvement. It is not clinical advice and not a decision tool for individual care: follow local guidelines and use clinical judgement.';

/** The caution every screen that could steer care carries. */
export function ClinicalCaution({ compact = false }: { compact?: boolean }) {
  if (compact) return <p className="cairn-caution-compact">{CLINICAL_CAUTION}</p>;
  return (
    <Callout intent={Intent.NONE} icon="info-sign" title="Audit and improvement support">
      {CLINICAL_CAUTION}
    </Callout>
  );
}
