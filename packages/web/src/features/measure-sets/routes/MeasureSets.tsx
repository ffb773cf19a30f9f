import { H2, HTMLTable, NonIdealState, Spinner, Tag } from '@blueprintjs/core';
import { Link } from 'react-router-dom';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useMeasureSets } from '../api/measure-sets';
import { MeasureSetStatusTag } from '../components/MeasureSetStatusTag';
import './MeasureSets.css';

/** `/measure-sets`: every version the person reads, and where each is used. */
export function MeasureSets() {
  usePageTitle('Measure sets');
  const list = useMeasureSets();
  return (
    <div className="cairn-measure-sets">
      <div className="cairn-page-head">
        <div>
          <H2>Measure sets</H2>
          <p className="cairn-muted">
            A measure set lists the care processes and treatment targets a quarter is measured by,
            with every threshold, population and guideline source. Published versions never change;
            a change is a new version, started as a draft from a published one.
          </p>
        </div>
      </div>
      <ProblemCallout error={list.error} />
      {list.isPending ? <Spinner aria-label="Loading measure sets" /> : null}
      {list.data && list.data.length === 0 ? (
        <NonIdealState icon="properties" title="No measure sets" />
      ) : null}
      {list.data && list.data.length > 0 ? (
        <HTMLTable compact striped className="cairn-measure-sets-table">
          <thead>
            <tr>
              <th scope="col">Version</th>
              <th scope="col">Status</th>
              <th scope="col">Measures</th>
              <th scope="col">Started from</th>
              <th scope="col">Published</th>
              <th scope="col">Used by</th>
            </tr>
          </thead>
          <tbody>
            {list.data.map((m) => (
              <tr key={m.id} data-measure-set={m.id}>
                <th scope="row">
                  <Link to={`/measure-sets/${encodeURIComponent(m.id)}`}>{m.label}</Link>
                  <div className="cairn-muted cairn-small">
                    {m.id}
                    {m.isDefault ? ' · default for new quarters' : ''}
                    {m.shippedWithCairn ? ' · shipped with Cairn' : ''}
                  </div>
                </th>
                <td>
                  <MeasureSetStatusTag status={m.status} />
                </td>
                <td className="cairn-nowrap">
                  {m.careProcesses} care processes
                  <br />
                  {m.treatmentTargets} treatment targets
                </td>
                <td>{m.basedOn ?? <span className="cairn-muted">—</span>}</td>
                <td>
                  {m.publishedAt ? (
                    <>
                      {formatDateTime(m.publishedAt)}
                      <div className="cairn-muted cairn-small">by {m.publishedBy}</div>
                    </>
                  ) : (
                    <span className="cairn-muted">
                      Not yet (started by {m.createdBy}, {formatDateTime(m.createdAt)})
                    </span>
                  )}
                </td>
                <td>
                  {m.usedBy.length === 0 ? (
                    <span className="cairn-muted">Not used yet</span>
                  ) : (
                    <span className="cairn-tags">
                      {m.usedBy.map((u) => (
                        <Tag
                          key={`${u.kind}-${u.id}`}
                          minimal
                          icon={u.kind === 'quarter' ? 'calendar' : 'document'}
                        >
                          {u.label}
                        </Tag>
                      ))}
                    </span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      ) : null}
    </div>
  );
}
