import { useState } from 'react';
import type { NotificationKind, NotificationSettings } from '../../../../shared/api/notifications.js';
import { Button } from '../../../components/ui/button.js';
import { describeError } from '../../../components/ui/error-state.js';
import { FormStatus, type FormStatusValue } from '../../../components/ui/form-status.js';
import { useUpdateNotificationSettings } from '../api/update-notification-settings.js';

/** One switch per e-mail kind; saved together so a half-applied change cannot happen. */
export function NotificationSettingsForm({ settings }: { settings: NotificationSettings }) {
  const initial = Object.fromEntries(settings.settings.map((s) => [s.kind, s.enabled])) as Record<NotificationKind, boolean>;
  const [values, setValues] = useState(initial);
  const [status, setStatus] = useState<FormStatusValue>(null);
  const update = useUpdateNotificationSettings();
  const changed = settings.settings.some((s) => values[s.kind] !== s.enabled);

  const save = async (e: React.FormEvent) => {
    e.preventDefault();
    setStatus(null);
    try {
      const saved = await update.mutateAsync(values);
      const on = saved.settings.filter((s) => s.enabled).length;
      setStatus({ kind: 'success', message: `Saved. You get ${on} of ${saved.settings.length} kinds of e-mail.` });
    } catch (error) {
      setStatus({ kind: 'error', message: describeError(error) });
    }
  };

  return (
    <form onSubmit={save} aria-label="E-mail notifications" className="space-y-4">
      <fieldset className="space-y-3">
        <legend className="sr-only">E-mails to receive</legend>
        {settings.settings.map((s) => (
          <label key={s.kind} className="flex items-start gap-3 rounded-md border border-rule bg-paper/50 px-3 py-2.5">
            <input
              type="checkbox"
              role="switch"
              aria-checked={values[s.kind]}
              checked={values[s.kind]}
              onChange={(e) => setValues((v) => ({ ...v, [s.kind]: e.target.checked }))}
              className="mt-0.5 size-4 accent-accent"
            />
            <span>
              <span className="block text-sm font-medium">{s.label}</span>
              <span className="block font-mono text-xs text-ink-soft">{values[s.kind] ? 'On' : 'Off'}</span>
            </span>
          </label>
        ))}
      </fieldset>
      <FormStatus status={status} />
      <Button type="submit" pending={update.isPending} pendingLabel="Saving…" disabled={!changed}>
        Save settings
      </Button>
    </form>
  );
}
