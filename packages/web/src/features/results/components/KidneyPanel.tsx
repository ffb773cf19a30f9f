import { HTMLTable } from '@blueprintjs/core';
import type { PracticeDetail, TypeSplit } from '../../../lib/api/types';
import { formatCount } from '../../../lib/format';

type Risk = 'low' | 'moderate' | 'high' | 'very-high';

/**
 * The KDIGO 2012 prognosis of CKD by GFR and albuminuria category (KDIGO 2012
 * Clinical Practice Guideline for the Evaluation and Management of CKD, the
 * "heat map" of risk). A lookup of the published table, not a statistic.
 */
const kdigoRisk: Record<string, Record<string, Risk>> = {
  G1: { A1: 'low', A2: 'moderate', A3: 'high' },
  G2: { A1: 'low', A2: 'moderate', A3: 'high' },
  G3a: { A1: 'moderate', A2: 'high', A3: 'very-high' },
  G3b: { A1: 'high', A2: 'very-high', A3: 'very-high' },
  G4: { A1: 'very-high', A2: 'very-high', A3: 'very-high' },
  G5: { A1: 'very-high', A2: 'very-high', A3: 'very-high' },
};

const riskWords: Record<Risk, string> = {
  low: 'Low risk',
  moderate: 'Moderately increased risk',
  high: 'High risk',
  'very-high': 'Very high risk',
};

/** Rows and columns the grid has beyond the KDIGO categories. */
const otherLabels: Record<string, string> = {
  no_creatinine: 'No creatinine recorded',
  sex_not_f_or_m: 'eGFR not computed (sex not F or M)',
  under_18: 'Under 18 (eGFR not computed)',
  no_acr: 'No ACR recorded',
};

export const kidneyLabel = (key: string): string => otherLabels[key] ?? key;

export function kidneyRisk(row: string, column: string): Risk | null {
  return kdigoRisk[row]?.[column] ?? null;
}

/** The practice's people by GFR × albuminuria category, with the region's counts. */
export function KidneyPanel({ detail, split }: { detail: PracticeDetail; split: TypeSplit }) {
  const grid = detail.kidney;
  const rows = grid.splits.find((s) => s.split === split)?.rows ?? [];
  return (
    <div>
      <p>
        People by eGFR category (CKD-EPI 2021) and albuminuria category (ACR), as KDIGO 2012 groups
        them. Each cell gives the practice&apos;s count, then the region&apos;s, and the KDIGO 2012
        risk of that cell in words.
      </p>
      <HTMLTable compact bordered className="cairn-kidney-grid">
        <thead>
          <tr>
            <th scope="col">GFR category</th>
            {grid.columns.map((c) => (
              <th scope="col" key={c}>
                {kidneyLabel(c)}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.row}>
              <th scope="row">{kidneyLabel(row.row)}</th>
              {grid.columns.map((column, i) => {
                const risk = kidneyRisk(row.row, column);
                return (
                  <td key={column} className={risk ? `cairn-kidney-${risk}` : undefined}>
                    <strong>{formatCount(row.practice[i] ?? 0)}</strong>
                    <span className="cairn-muted cairn-small">
                      {' '}
                      · region {row.region[i]?.display ?? '—'}
                    </span>
                    {risk ? <div className="cairn-small">{riskWords[risk]}</div> : null}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </HTMLTable>
    </div>
  );
}
