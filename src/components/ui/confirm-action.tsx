import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Button, buttonClasses } from './button.js';

/**
 * A button that asks before it acts: the first press shows the question with a confirm and a
 * cancel button in place (focus moves to cancel, Escape cancels), so nothing is done by one
 * stray press and no pop-up window is needed.
 */
export function ConfirmAction({
  label,
  question,
  confirmLabel,
  pendingLabel,
  onConfirm,
  pending = false,
  variant = 'danger',
  size = 'md',
}: {
  label: string;
  question: ReactNode;
  confirmLabel: string;
  pendingLabel?: string;
  onConfirm: () => void | Promise<unknown>;
  pending?: boolean;
  variant?: 'danger' | 'primary' | 'secondary';
  size?: 'sm' | 'md';
}) {
  const [asking, setAsking] = useState(false);
  const questionId = useId();
  const cancelRef = useRef<HTMLButtonElement>(null);
  const openRef = useRef<HTMLButtonElement>(null);
  const wasAsking = useRef(false);

  useEffect(() => {
    if (asking) cancelRef.current?.focus();
    else if (wasAsking.current) openRef.current?.focus();
    wasAsking.current = asking;
  }, [asking]);

  if (!asking) {
    return (
      <button ref={openRef} type="button" className={buttonClasses(variant, size)} onClick={() => setAsking(true)}>
        {label}
      </button>
    );
  }
  return (
    <div
      role="group"
      aria-labelledby={questionId}
      className="flex flex-wrap items-center gap-2 rounded-md border border-rule-strong bg-paper px-3 py-2"
      onKeyDown={(e) => {
        if (e.key === 'Escape') {
          e.stopPropagation();
          setAsking(false);
        }
      }}
    >
      <p id={questionId} className="text-sm text-ink">
        {question}
      </p>
      <Button
        variant={variant}
        size="sm"
        pending={pending}
        pendingLabel={pendingLabel}
        onClick={async () => {
          // The caller shows a failure; the question stays so the person can try again.
          try {
            await onConfirm();
            setAsking(false);
          } catch {
            /* shown by the caller */
          }
        }}
      >
        {confirmLabel}
      </Button>
      <button ref={cancelRef} type="button" className={buttonClasses('secondary', 'sm')} onClick={() => setAsking(false)}>
        Cancel
      </button>
    </div>
  );
}
