import { Intent } from '@blueprintjs/core';
import { Notice } from './Notice';

export const CLINICAL_CAUTION =
  'Cairn supports clinical audit and quality improvement. It is not clinical advice and not a decision tool for individual care: follow local guidelines and use clinical judgement.';

/**
 * The caution a screen that could steer care carries, once, where it matters (beside the
 * results, flags or lists it is about).
 */
export function ClinicalCaution({ compact = false }: { compact?: boolean }) {
  if (compact) return <p className="cairn-caution-compact">{CLINICAL_CAUTION}</p>;
  return (
    <Notice
      intent={Intent.NONE}
      icon="info-sign"
      title="Audit and improvement support"
      className="cairn-caution"
    >
      {CLINICAL_CAUTION}
    </Notice>
  );
}
