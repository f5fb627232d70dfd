import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { cn } from './cn.js';

const control =
  'block rounded-md border bg-paper-raised text-ink placeholder:text-ink-faint ' +
  'focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent ' +
  'disabled:bg-paper-sunk disabled:text-ink-soft [&[readonly]]:bg-paper-sunk/70';

function controlClasses(invalid: boolean, className?: string, size: 'md' | 'sm' = 'md') {
  return cn(
    control,
    size === 'md' ? 'w-full px-3 py-2' : 'h-8 w-auto py-1 pl-2 pr-1 text-sm leading-5',
    invalid ? 'border-signal-error' : 'border-rule-strong',
    className,
  );
}

interface FieldFrameProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  className?: string;
  children: ReactNode;
}

/** Label above, control, then hint or error below; the error is tied to the control by id. */
export function FieldFrame({ id, label, hint, error, className, children }: FieldFrameProps) {
  return (
    <div className={cn('space-y-1.5', className)}>
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      {children}
      {error ? (
        <p id={`${id}-error`} className="flex items-start gap-1.5 text-sm text-signal-error">
          <span aria-hidden="true" className="mt-[0.3rem] inline-block size-2 shrink-0 rotate-45 bg-signal-error" />
          <span>{error}</span>
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

function describedBy(id: string, error?: string, hint?: ReactNode) {
  return error ? `${id}-error` : hint ? `${id}-hint` : undefined;
}

type CommonProps = { label: ReactNode; hint?: ReactNode; error?: string; containerClassName?: string };

export function TextField({
  label,
  hint,
  error,
  containerClassName,
  className,
  id: givenId,
  ref,
  ...rest
}: CommonProps & InputHTMLAttributes<HTMLInputElement> & { ref?: Ref<HTMLInputElement> }) {
  const autoId = useId();
  const id = givenId ?? autoId;
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={containerClassName}>
      <input
        id={id}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className={controlClasses(Boolean(error), className)}
        {...rest}
      />
    </FieldFrame>
  );
}

export function TextAreaField({
  label,
  hint,
  error,
  containerClassName,
  className,
  id: givenId,
  ref,
  ...rest
}: CommonProps & TextareaHTMLAttributes<HTMLTextAreaElement> & { ref?: Ref<HTMLTextAreaElement> }) {
  const autoId = useId();
  const id = givenId ?? autoId;
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={containerClassName}>
      <textarea
        id={id}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className={controlClasses(Boolean(error), cn('min-h-24', className))}
        {...rest}
      />
    </FieldFrame>
  );
}

export function SelectField({
  label,
  hint,
  error,
  containerClassName,
  className,
  id: givenId,
  ref,
  children,
  ...rest
}: CommonProps & SelectHTMLAttributes<HTMLSelectElement> & { ref?: Ref<HTMLSelectElement> }) {
  const autoId = useId();
  const id = givenId ?? autoId;
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error} className={containerClassName}>
      <select
        id={id}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error, hint)}
        className={controlClasses(Boolean(error), className)}
        {...rest}
      >
        {children}
      </select>
    </FieldFrame>
  );
}

/** A bare select for use inside tables, where the label is visually hidden. */
export function InlineSelect({
  className,
  ref,
  ...rest
}: SelectHTMLAttributes<HTMLSelectElement> & { ref?: Ref<HTMLSelectElement> }) {
  return <select ref={ref} className={controlClasses(false, className, 'sm')} {...rest} />;
}
