import { Button, ControlGroup, HTMLSelect, Tag } from '@blueprintjs/core';
import { useState } from 'react';
import type { Practice, PracticeRef } from '../../../lib/api/types';

interface Props {
  /** Practices already chosen */
  value: PracticeRef[];
  options: Practice[];
  onAdd: (practiceId: number) => void;
  onRemove: (practiceId: number) => void;
  disabled?: boolean;
  /** Accessible name of the select */
  label: string;
}

/** The practices a practice lead leads: tags to remove, a select to add one more. */
export function PracticePicker({ value, options, onAdd, onRemove, disabled, label }: Props) {
  const [choice, setChoice] = useState('');
  const available = options.filter((o) => !value.some((v) => v.id === o.id));
  return (
    <div className="cairn-practice-picker">
      <div className="cairn-practice-tags">
        {value.length === 0 ? <span className="cairn-muted">No practices yet.</span> : null}
        {value.map((p) => (
          <Tag
            key={p.id}
            large
            minimal
            onRemove={disabled ? undefined : () => onRemove(p.id)}
            htmlTitle={`${p.name} (${p.code})`}
          >
            {p.code} · {p.name}
          </Tag>
        ))}
      </div>
      <ControlGroup>
        <HTMLSelect
          aria-label={label}
          value={choice}
          disabled={disabled || available.length === 0}
          onChange={(e) => setChoice(e.currentTarget.value)}
        >
          <option value="">Add a practice…</option>
          {available.map((o) => (
            <option key={o.id} value={o.id}>
              {o.code} · {o.name}
              {o.localityName ? ` (${o.localityName})` : ''}
            </option>
          ))}
        </HTMLSelect>
        <Button
          icon="add"
          disabled={disabled || !choice}
          onClick={() => {
            onAdd(Number(choice));
            setChoice('');
          }}
        >
          Add
        </Button>
      </ControlGroup>
    </div>
  );
}
