import { useId, useState, type FormEvent } from 'react';
import { commentBodySchema } from '../../../../shared/api/critique.js';
import { Button } from '../../../components/ui/button.js';
import { describeError } from '../../../components/ui/error-state.js';
import { TextAreaField } from '../../../components/ui/field.js';
import { isApiError } from '../../../lib/api-client.js';

/** The first message the comment schema gives for `body`, or null when it is fine. */
export function commentProblem(body: string): string | null {
  const r = commentBodySchema.safeParse(body);
  return r.success ? null : (r.error.issues[0]?.message ?? 'Write a comment');
}

/** The server's word on a comment that was not stored: its field message when it named the body. */
export function serverProblem(error: unknown): string {
  if (isApiError(error)) return error.fields['body.body'] ?? error.fields.body ?? error.message;
  return describeError(error);
}

/**
 * A markdown comment box with its send button: checks the body with the shared schema first,
 * then sends; the text stays when sending fails and clears once stored.
 */
export function CommentBox({
  label,
  submitLabel,
  pendingLabel,
  onSubmit,
  pending,
}: {
  label: string;
  submitLabel: string;
  pendingLabel: string;
  onSubmit(body: string): Promise<unknown>;
  pending: boolean;
}) {
  const [body, setBody] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const id = useId();
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const p = commentProblem(body);
    setProblem(p);
    if (p) return;
    try {
      await onSubmit(body.trim());
      setBody('');
    } catch (error) {
      setProblem(serverProblem(error));
    }
  };
  return (
    <form onSubmit={submit} className="space-y-2" noValidate>
      <TextAreaField
        id={id}
        label={label}
        hint="Markdown: **bold**, lists, links. HTML tags are left out."
        error={problem ?? undefined}
        value={body}
        onChange={(e) => setBody(e.target.value)}
        rows={3}
      />
      <Button type="submit" size="sm" pending={pending} pendingLabel={pendingLabel}>
        {submitLabel}
      </Button>
    </form>
  );
}
