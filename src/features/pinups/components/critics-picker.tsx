import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { describeError } from '../../../components/ui/error-state.js';
import { FormStatus, type FormStatusValue } from '../../../components/ui/form-status.js';

export interface CriticOption {
  id: number;
  name: string;
}

/**
 * The critics of one submission as a group of checkboxes over the studio's critics, saved with
 * one button (the server replaces the list). Nothing is sent while the choice is unchanged.
 */
export function CriticsPicker({
  participantName,
  critics,
  assigned,
  onSave,
}: {
  participantName: string;
  critics: CriticOption[];
  assigned: CriticOption[];
  onSave: (userIds: number[]) => Promise<unknown>;
}) {
  const initial = assigned.map((c) => c.id).sort((a, b) => a - b);
  const [chosen, setChosen] = useState<number[]>(initial);
  const [saving, setSaving] = useState(false);
  const [status, setStatus] = useState<FormStatusValue>(null);
  const legendId = useId();
  const changed = chosen.length !== initial.length || chosen.some((id, i) => id !== initial[i]);
  // Critics assigned earlier who are no longer critics of the studio still show, so they can be removed.
  const everyone = [...critics, ...assigned.filter((a) => !critics.some((c) => c.id === a.id))];

  const toggle = (id: number, on: boolean) => setChosen((list) => (on ? [...list, id] : list.filter((v) => v !== id)).sort((a, b) => a - b));

  const save = async () => {
    setSaving(true);
    setStatus(null);
    try {
      await onSave(chosen);
      setStatus({ kind: 'success', message: `Critics of ${participantName} saved.` });
    } catch (error) {
      setStatus({ kind: 'error', message: describeError(error) });
    } finally {
      setSaving(false);
    }
  };

  if (everyone.length === 0) {
    return <p className="text-sm text-ink-soft">This studio has no critics yet; invite one from the studio page.</p>;
  }
  return (
    <fieldset aria-labelledby={legendId} className="space-y-2">
      <legend id={legendId} className="sr-only">
        Critics of {participantName}
      </legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1">
        {everyone.map((c) => (
          <label key={c.id} className="inline-flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              className="size-4 accent-accent focus-visible:outline-2 focus-visible:outline-accent"
              checked={chosen.includes(c.id)}
              onChange={(e) => toggle(c.id, e.target.checked)}
            />
            {c.name}
          </label>
        ))}
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" size="sm" disabled={!changed} pending={saving} pendingLabel="Saving…" onClick={() => void save()} aria-label={`Save critics of ${participantName}`}>
          Save critics
        </Button>
        <FormStatus status={status} />
      </div>
    </fieldset>
  );
}
