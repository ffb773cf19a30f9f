import { AnchorButton, Intent } from '@blueprintjs/core';
import { Notice } from '../../../components/Notice';
import { SupportCodes } from '../../../components/SupportCodes';
import type { Submission } from '../../../lib/api/types';
import { TEMPLATE_CSV, TEMPLATE_XLSX } from '../api/extracts';
import { LinkButton } from './LinkButton';

/**
 * A refused file: what is wrong with it and how to fix it, first on the page. Every problem the
 * API found at once (the heading row's) is listed, each with its fix, so that one corrected
 * file answers them all. The codes are kept for support, out of the way.
 */
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
  const problems = refusal.problems.length > 0 ? refusal.problems : [refusal];
  const several = problems.length > 1;
  return (
    <Notice
      intent={Intent.DANGER}
      icon="ban-circle"
      title={
        several
          ? `This file was refused: ${problems.length} problems to fix`
          : `This file was refused: ${refusal.title}`
      }
      headingLevel={2}
      className="cairn-refusal"
      role="alert"
    >
      {several ? (
        <>
          <p className="cairn-refusal-message">
            Cairn found {problems.length} problems in the heading row. Fix them all, then upload the
            corrected file once.
          </p>
          <ol className="cairn-refusal-problems">
            {problems.map((p) => (
              <li key={`${p.code}-${p.message}`} data-code={p.code}>
                <h3 className="bp6-heading cairn-refusal-problem-title" title={`Code: ${p.code}`}>
                  {p.title}
                </h3>
                <p className="cairn-refusal-message">{p.message}</p>
                <p className="cairn-refusal-fix">
                  <span className="cairn-refusal-fix-label">How to fix it: </span>
                  {p.fix}
                </p>
              </li>
            ))}
          </ol>
        </>
      ) : (
        <>
          <p className="cairn-refusal-message">{refusal.message}</p>
          {refusal.fix ? (
            <>
              <h3 className="bp6-heading cairn-refusal-fix-heading">How to fix it</h3>
              <p className="cairn-refusal-fix">{refusal.fix}</p>
            </>
          ) : null}
        </>
      )}
      <p className="cairn-refusal-note">Nothing from this file is used.</p>
      <SupportCodes label="Refusal code" codes={problems.map((p) => p.code)} />
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
    </Notice>
  );
}
