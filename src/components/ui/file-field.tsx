import { useId, type ReactNode } from 'react';
import { FieldFrame } from './field.js';
import { cn } from './cn.js';

/** Bytes as a short figure a person reads at a glance (1.4 MB). */
export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '—';
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

export interface FileFieldProps {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  /** `accept` of the input, e.g. ".json,application/json"; the server still sniffs the content. */
  accept?: string;
  multiple?: boolean;
  files: File[];
  onChange: (files: File[]) => void;
  disabled?: boolean;
  className?: string;
  /** Explicit id for the input (tests and labels elsewhere); generated when omitted. */
  id?: string;
  name?: string;
}

/**
 * A file input with its label, hint or error, and the chosen files listed by name and size.
 * Controlled: the parent holds the files, so a failed upload keeps them for another try.
 */
export function FileField({ label, hint, error, accept, multiple, files, onChange, disabled, className, id: givenId, name }: FileFieldProps) {
  const autoId = useId();
  const id = givenId ?? autoId;
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={className}>
      <input
        id={id}
        name={name}
        type="file"
        accept={accept}
        multiple={multiple}
        disabled={disabled}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined}
        onChange={(e) => onChange(Array.from(e.currentTarget.files ?? []))}
        className={cn(
          'block w-full rounded-md border bg-paper-raised text-sm text-ink file:mr-3 file:cursor-pointer file:rounded-l-md file:border-0 file:border-r file:border-rule-strong file:bg-paper-sunk file:px-3 file:py-2 file:font-medium file:text-ink',
          'focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent disabled:opacity-60',
          error ? 'border-signal-error' : 'border-rule-strong',
        )}
      />
      {files.length > 0 ? (
        <ul className="space-y-0.5 font-mono text-xs text-ink-soft" aria-label="Chosen files">
          {files.map((file, i) => (
            <li key={`${file.name}-${i}`}>
              {file.name} · {formatBytes(file.size)}
            </li>
          ))}
        </ul>
      ) : null}
    </FieldFrame>
  );
}
