import { AnchorButton, Button, FormGroup, HTMLSelect, HTMLTable, Spinner } from '@blueprintjs/core';
import { useId, useState } from 'react';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { PracticeResults, TypeSplit } from '../../../lib/api/types';
import { formatCount } from '../../../lib/format';
import { RECALL_PAGE, recallPath, useRecallList } from '../api/results';

/** The practice's own records that miss a measure, a page at a time, and the downloads. */
export function RecallPanel({ results, split }: { results: PracticeResults; split: TypeSplit }) {
  const selectId = useId();
  const [measure, setMeasure] = useState(results.measures[0]?.measure.key ?? null);
  const [offset, setOffset] = useState(0);
  const practiceId = results.practice.id;
  const quarterId = results.quarter.id;
  const list = useRecallList(practiceId, quarterId, measure, split, offset);
  const data = list.data;
  return (
    <div>
      <div className="cairn-results-controls">
        <FormGroup label="Measure" labelFor={selectId} inline>
          <HTMLSelect
            id={selectId}
            value={measure ?? ''}
            onChange={(e) => {
              setMeasure(e.currentTarget.value);
              setOffset(0);
            }}
            options={results.measures.map((m) => ({
              value: m.measure.key,
              label: m.measure.label,
            }))}
          />
        </FormGroup>
        {measure ? (
          <>
            <AnchorButton
              role="link"
              icon="download"
              href={recallPath(practiceId, quarterId, measure, split, '.csv')}
              download
            >
              Download CSV
            </AnchorButton>
            <AnchorButton
              role="link"
              icon="download"
              href={recallPath(practiceId, quarterId, measure, split, '.xlsx')}
              download
            >
              Download XLSX
            </AnchorButton>
          </>
        ) : null}
      </div>
      {list.isPending && measure ? (
        <Spinner size={20} aria-label="Reading the recall list" />
      ) : null}
      <ProblemCallout error={list.error} />
      {data ? (
        <>
          <p>
            {formatCount(data.counts.listed)} of {formatCount(data.counts.denominator)} people in
            the denominator of <strong>{data.measure.label}</strong> miss it (
            {formatCount(data.counts.eligible)} eligible).{' '}
            {data.recordReferences === 'record_ref'
              ? 'References are the practice’s own record references.'
              : 'References are pseudonyms: only the practice sees its own record references.'}
          </p>
          {data.items.length === 0 ? (
            <EmptyState icon="tick" title="Nobody to recall for this measure" />
          ) : (
            <HTMLTable compact striped className="cairn-results-table" aria-label="Recall list">
              <thead>
                <tr>
                  <th scope="col">Reference</th>
                  <th scope="col">Age band</th>
                  <th scope="col">Sex</th>
                  <th scope="col">Type</th>
                  <th scope="col">Why listed</th>
                  <th scope="col">Last recorded</th>
                </tr>
              </thead>
              <tbody>
                {data.items.map((item) => (
                  <tr key={item.row}>
                    <td>
                      <code>{item.reference}</code>
                    </td>
                    <td>{item.ageBand}</td>
                    <td>{item.sex}</td>
                    <td>{item.diabetesType.replace('type', 'Type ')}</td>
                    <td>{item.detail || item.reasonText}</td>
                    <td>{item.lastRecorded ?? '—'}</td>
                  </tr>
                ))}
              </tbody>
            </HTMLTable>
          )}
          {data.total > RECALL_PAGE ? (
            <div className="cairn-results-controls">
              <Button
                icon="chevron-left"
                disabled={offset === 0}
                onClick={() => setOffset(Math.max(0, offset - RECALL_PAGE))}
              >
                Previous
              </Button>
              <span>
                {formatCount(offset + 1)}–{formatCount(Math.min(data.total, offset + RECALL_PAGE))}{' '}
                of {formatCount(data.total)}
              </span>
              <Button
                endIcon="chevron-right"
                disabled={offset + RECALL_PAGE >= data.total}
                onClick={() => setOffset(offset + RECALL_PAGE)}
              >
                Next
              </Button>
            </div>
          ) : null}
        </>
      ) : null}
    </div>
  );
}
