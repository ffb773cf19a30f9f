import { FormGroup, InputGroup, Intent } from '@blueprintjs/core';
import { useId, useState } from 'react';
import { fromRegionDate, REGION_DATE_FORMAT, toRegionDate } from '../lib/region-dates';

/**
 * A day that narrows a list (from, to), typed the region's way (DD/MM/YYYY) as in every form of
 * Cairn, whatever the browser's language (a native date input follows the browser's). It applies
 * when the field is left or Enter is pressed; empty means no limit. `value` and `onChange` use
 * "YYYY-MM-DD" ('' for none). Forms use DateField, which shows the form's own errors.
 */
export function DateFilter({
  label,
  value,
  onChange,
}: {
  label: string;
  value: string;
  onChange: (iso: string) => void;
}) {
  const id = useId();
  const helpId = `${id}-help`;
  const [text, setText] = useState(value ? toRegionDate(value) : '');
  const [shown, setShown] = useState(value);
  const [problem, setProblem] = useState<string | null>(null);
  // The value changed from outside (a link, "clear filters"): show it.
  if (value !== shown) {
    setShown(value);
    setText(value ? toRegionDate(value) : '');
    setProblem(null);
  }
  const commit = () => {
    if (text.trim() === '') {
      setProblem(null);
      if (value !== '') onChange('');
      return;
    }
    const parsed = fromRegionDate(text, '04/12/2026');
    if (!parsed.ok) {
      setProblem(parsed.message);
      return;
    }
    setProblem(null);
    setText(toRegionDate(parsed.iso));
    if (parsed.iso !== value) onChange(parsed.iso);
  };
  return (
    <FormGroup
      inline
      label={label}
      labelFor={id}
      className="cairn-date-field"
      intent={problem ? Intent.DANGER : Intent.NONE}
      helperText={problem ? <span id={helpId}>{problem}</span> : undefined}
    >
      <InputGroup
        id={id}
        value={text}
        placeholder={REGION_DATE_FORMAT}
        inputMode="numeric"
        autoComplete="off"
        intent={problem ? Intent.DANGER : Intent.NONE}
        aria-invalid={problem ? true : undefined}
        aria-describedby={problem ? helpId : undefined}
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
