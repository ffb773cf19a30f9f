import { FormGroup, InputGroup, Intent } from '@blueprintjs/core';
import { REGION_DATE_FORMAT } from '../lib/region-dates';

interface Props {
  id: string;
  label: string;
  value: string;
  onChange: (value: string) => void;
  /** What is wrong, shown under the field (the form's own check or the API's) */
  error?: string;
  /** Shown under the field when nothing is wrong */
  hint?: string;
}

/** A calendar date typed in the region's format (DD/MM/YYYY); the form converts it. */
export function DateField({ id, label, value, onChange, error, hint }: Props) {
  const helpId = `${id}-help`;
  return (
    <FormGroup
      label={label}
      labelFor={id}
      labelInfo={`(${REGION_DATE_FORMAT})`}
      intent={error ? Intent.DANGER : Intent.NONE}
      helperText={<span id={helpId}>{error ?? hint}</span>}
    >
      <InputGroup
        id={id}
        value={value}
        onValueChange={onChange}
        placeholder={REGION_DATE_FORMAT}
        inputMode="numeric"
        autoComplete="off"
        intent={error ? Intent.DANGER : Intent.NONE}
        aria-invalid={error ? true : undefined}
        aria-describedby={helpId}
        leftIcon="calendar"
      />
    </FormGroup>
  );
}
