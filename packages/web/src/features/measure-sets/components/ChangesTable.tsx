import { HTMLTable, NonIdealState, Spinner } from '@blueprintjs/core';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { useMeasureSetChanges } from '../api/measure-sets';

const kindWords = { added: 'Added', removed: 'Removed', changed: 'Changed' } as const;

/** The differences of a version from the one it was started from, as the API words them. */
export function ChangesTable({ id, basedOn }: { id: string; basedOn: string }) {
  const changes = useMeasureSetChanges(id, true);
  if (changes.isPending) return <Spinner size={20} aria-label="Reading the differences" />;
  if (changes.isError) return <ProblemCallout error={changes.error} />;
  const list = changes.data.changes;
  if (list.length === 0) {
    return (
      <NonIdealState
        icon="tick"
        title="No differences yet"
        description={`This version is the same as ${basedOn}.`}
        layout="horizontal"
      />
    );
  }
  return (
    <HTMLTable
      compact
      striped
      className="cairn-changes-table"
      aria-label={`Differences from ${basedOn}`}
    >
      <thead>
        <tr>
          <th scope="col">Measure</th>
          <th scope="col">What</th>
          <th scope="col">In {changes.data.basedOn}</th>
          <th scope="col">In {id}</th>
        </tr>
      </thead>
      <tbody>
        {list.map((c, i) => (
          <tr key={i} data-change={`${c.measureKey ?? 'set'}:${c.field ?? c.kind}`}>
            <td>
              {c.measureLabel ?? 'The measure set'}
              {c.measureKey ? <div className="cairn-muted cairn-small">{c.measureKey}</div> : null}
            </td>
            <td>{c.kind === 'changed' ? c.fieldLabel : <strong>{kindWords[c.kind]}</strong>}</td>
            <td className="cairn-before">{c.before ?? <span className="cairn-muted">—</span>}</td>
            <td className="cairn-after">{c.after ?? <span className="cairn-muted">—</span>}</td>
          </tr>
        ))}
      </tbody>
    </HTMLTable>
  );
}
