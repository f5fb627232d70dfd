import { useCallback, useState } from 'react';
import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import type { FormStatusValue } from '../components/ui/form-status.js';
import { describeError } from '../components/ui/error-state.js';
import { isApiError } from './api-client.js';
import { applyFieldErrors } from './form-errors.js';

/**
 * The status line of a form plus `fail(error)`, which puts the server's field messages at the
 * fields and states the rest, so nothing the server said is lost.
 */
export function useSubmitStatus<T extends FieldValues>(form: UseFormReturn<T, any, any>) {
  const [status, setStatus] = useState<FormStatusValue>(null);
  const { setError, getValues } = form;

  const fail = useCallback(
    (error: unknown) => {
      if (isApiError(error)) {
        // A nested field (constraints.maxSheets, rubric.0.weight) is placed when the form has it.
        const has = (name: string) => name !== '' && getValues(name as Path<T>) !== undefined;
        const unplaced = applyFieldErrors(error.fields, has, (name, e) => setError(name as Path<T>, e));
        const extra = unplaced.length ? ` ${unplaced.join(' ')}` : '';
        setStatus({ kind: 'error', message: `${error.message}${extra}` });
      } else {
        setStatus({ kind: 'error', message: describeError(error) });
      }
    },
    [getValues, setError],
  );

  const succeed = useCallback((message: string) => setStatus({ kind: 'success', message }), []);
  const clear = useCallback(() => setStatus(null), []);
  return { status, fail, succeed, clear };
}
