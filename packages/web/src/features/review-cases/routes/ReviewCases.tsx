import { H1, HTMLTable, Spinner, Tag } from '@blueprintjs/core';
import { Link } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import { formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { roleValues } from '../../../lib/api/types';
import { useCases } from '../api/review-cases';
import { StatusTag } from '../components/StatusTag';
import '../review.css';

/** `/review-cases`: the cases the reader may see (a practice lead: their practices’ only). */
export function ReviewCases() {
  usePageTitle('Review cases');
  return (
    <RequireRole roles={roleValues}>
      <ReviewCasesScreen />
    </RequireRole>
  );
}

function ReviewCasesScreen() {
  const cases = useCases();
  const list = cases.data?.cases ?? [];
  return (
    <div className="cairn-review">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Review cases</H1>
          <p className="cairn-muted">
            Each case follows up one practice’s result on one measure with the practice, until there
            is a finding.
          </p>
        </div>
        {cases.data?.mayOpen ? <Link to="/outliers">Outlier list</Link> : null}
      </div>
      <ClinicalCaution compact />
      <ProblemCallout error={cases.error} />
      {cases.isPending ? <Spinner aria-label="Loading the review cases" /> : null}
      {cases.data && list.length === 0 ? (
        <EmptyState
          icon="search-template"
          title="No review cases"
          description={
            cases.data.mayOpen
              ? 'Open one from the outlier list.'
              : 'When the audit team asks your practice about a result, the case appears here.'
          }
        />
      ) : null}
      {list.length > 0 ? (
        <HTMLTable compact striped className="cairn-review-table">
          <thead>
            <tr>
              <th scope="col">Case</th>
              <th scope="col">Practice</th>
              <th scope="col">Measure</th>
              <th scope="col">Quarter</th>
              <th scope="col">State</th>
              <th scope="col">Last change</th>
            </tr>
          </thead>
          <tbody>
            {list.map((c) => (
              <tr key={c.id}>
                <th scope="row">
                  <Link to={`/review-cases/${c.id}`}>Case {c.id}</Link>
                </th>
                <td>
                  {c.practice.code} {c.practice.name}
                </td>
                <td>{c.measure.label}</td>
                <td>{c.quarter.label}</td>
                <td>
                  <StatusTag status={c.status} label={c.statusLabel} />
                  {c.findingLabel ? <Tag minimal>{c.findingLabel}</Tag> : null}
                  {c.reopened ? (
                    <span className="cairn-muted cairn-review-reopened-note">
                      {' '}
                      reopened {formatDateTime(c.reopened.at)}
                      {c.reopened.previousFindingLabel
                        ? `; last finding “${c.reopened.previousFindingLabel}”`
                        : ''}
                    </span>
                  ) : null}
                </td>
                <td className="cairn-nowrap">{formatDateTime(c.updatedAt)}</td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      ) : null}
    </div>
  );
}
