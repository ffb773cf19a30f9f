import { FormGroup, InputGroup, Intent } from '@blueprintjs/core';
import { useId, useState } from 'react';
import { formatDate, parseDate } from '../lib/format';

/**
 * A day, typed the region's way ("4/12/2026", "4 Dec 2026" or "2026-12-04") and shown as the
 * rest of Cairn shows dates ("4 Dec 2026"), whatever the browser's language (a native date input
 * follows the browser's). `value` and `onChange` use "YYYY-MM-DD" ('' for none).
 */
export function DateField({
  label,
  value,
  onChange,
}: {
  label: string;
  value: string;
  onChange: (iso: string) => void;
}) {
  const id = useId();
  const [text, setText] = useState(value ? formatDate(value) : '');
  const [shown, setShown] = useState(value);
  const [invalid, setInvalid] = useState(false);
  // The value changed from outside (a link, "clear filters"): show it.
  if (value !== shown) {
    setShown(value);
    setText(value ? formatDate(value) : '');
    setInvalid(false);
  }
  const commit = () => {
    const trimmed = text.trim();
    if (trimmed === '') {
      setInvalid(false);
      if (value !== '') onChange('');
      return;
    }
    const iso = parseDate(trimmed);
    if (!iso) {
      setInvalid(true);
      return;
    }
    setInvalid(false);
    setText(formatDate(iso));
    if (iso !== value) onChange(iso);
  };
  return (
    <FormGroup
      inline
      label={label}
      labelFor={id}
      className="cairn-date-field"
      intent={invalid ? Intent.DANGER : Intent.NONE}
      helperText={invalid ? 'Write a date such as 4 Dec 2026 or 4/12/2026' : undefined}
    >
      <InputGroup
        id={id}
        value={text}
        placeholder="e.g. 4 Dec 2026"
        intent={invalid ? Intent.DANGER : Intent.NONE}
        aria-invalid={invalid}
        onValueChange={setText}
        onBlur={commit}
        onKeyDown={(event) => {
          if (event.key === 'Enter') commit();
        }}
        size="small"
      />
    </FormGroup>
  );
}
