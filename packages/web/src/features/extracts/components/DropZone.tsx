import { Button, Icon } from '@blueprintjs/core';
import { type DragEvent, useId, useRef, useState } from 'react';
import { formatBytes } from './format';

interface Props {
  file: File | null;
  onFile: (file: File | null) => void;
  disabled?: boolean;
  /** Shown under the prompt: the limits the server sends */
  hint?: string;
}

export const ACCEPT =
  '.xlsx,.csv,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Drop the extract here, or choose it with the file picker (a real file input). */
export function DropZone({ file, onFile, disabled, hint }: Props) {
  const input = useRef<HTMLInputElement>(null);
  const [over, setOver] = useState(false);
  const id = useId();

  const onDrop = (event: DragEvent) => {
    event.preventDefault();
    setOver(false);
    if (disabled) return;
    const dropped = event.dataTransfer.files[0];
    if (dropped) onFile(dropped);
  };

  return (
    <div
      className={`cairn-drop-zone${over ? ' cairn-drop-over' : ''}${file ? ' cairn-drop-has-file' : ''}${disabled ? ' cairn-drop-disabled' : ''}`}
      onDragOver={(event) => {
        event.preventDefault();
        if (!disabled) setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={onDrop}
      data-testid="extract-drop-zone"
    >
      <input
        ref={input}
        id={id}
        type="file"
        accept={ACCEPT}
        className="visually-hidden"
        aria-label="Extract file"
        disabled={disabled}
        onChange={(event) => {
          onFile(event.currentTarget.files?.[0] ?? null);
          event.currentTarget.value = '';
        }}
      />
      {file ? (
        <div className="cairn-drop-file">
          <Icon icon="document" size={28} />
          <div>
            <div className="cairn-drop-file-name">{file.name}</div>
            <div className="cairn-muted">{formatBytes(file.size)}</div>
          </div>
          <Button
            variant="minimal"
            icon="cross"
            disabled={disabled}
            onClick={() => onFile(null)}
            aria-label="Remove the chosen file"
          />
        </div>
      ) : (
        <>
          <Icon icon="cloud-upload" size={32} className="cairn-drop-icon" />
          <p className="cairn-drop-prompt">
            <strong>Drop the extract file here</strong>
            <span className="cairn-muted"> or </span>
          </p>
        </>
      )}
      <Button
        icon="folder-open"
        disabled={disabled}
        onClick={() => input.current?.click()}
        aria-describedby={`${id}-hint`}
      >
        {file ? 'Choose a different file' : 'Choose a file'}
      </Button>
      <p id={`${id}-hint`} className="cairn-muted cairn-drop-hint">
        {hint ?? 'An .xlsx workbook or a .csv file saved as UTF-8.'}
      </p>
    </div>
  );
}
