import { AnchorButton, Callout, Intent } from '@blueprintjs/core';
import type { Submission } from '../../../lib/api/types';
import { TEMPLATE_CSV, TEMPLATE_XLSX } from '../api/extracts';
import { LinkButton } from './LinkButton';

/** A refused file: what is wrong with it and how to fix it, first on the page. */
export function RefusalCallout({
  submission,
  uploadTo,
}: {
  submission: Submission;
  /** Where to send a corrected file, when the person may */
  uploadTo: string | null;
}) {
  const refusal = submission.refusal;
  if (!refusal) return null;
  return (
    <Callout
      intent={Intent.DANGER}
      icon="ban-circle"
      title={`This file was refused: ${refusal.title}`}
      className="cairn-refusal"
      role="alert"
    >
      <p className="cairn-refusal-message">{refusal.message}</p>
      {refusal.fix ? (
        <>
          <h4 className="cairn-refusal-fix-heading">How to fix it</h4>
          <p className="cairn-refusal-fix">{refusal.fix}</p>
        </>
      ) : null}
      <p className="cairn-muted">
        Nothing from this file is used. Refusal code <code>{refusal.code}</code>.
      </p>
      <div className="cairn-button-row">
        {uploadTo ? (
          <LinkButton to={uploadTo} intent={Intent.PRIMARY} icon="upload">
            Upload a corrected extract
          </LinkButton>
        ) : null}
        <AnchorButton href={TEMPLATE_XLSX} icon="th" download variant="outlined">
          Template (XLSX)
        </AnchorButton>
        <AnchorButton href={TEMPLATE_CSV} icon="document" download variant="outlined">
          Template (CSV)
        </AnchorButton>
      </div>
    </Callout>
  );
}
