import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import { Button, type ButtonTone } from './button.tsx';

/**
 * A button that asks before it acts: the first press turns it into a question with a
 * confirm and a cancel button (focus moves to confirm; Escape or Cancel goes back and
 * returns focus). Inline rather than a modal, so it works the same with keyboard, screen
 * reader and in tests.
 */
export function ConfirmButton({
  label,
  question,
  confirmLabel,
  onConfirm,
  pending = false,
  tone = 'danger',
  size = 'sm',
}: {
  label: string;
  question: string;
  confirmLabel: string;
  onConfirm: () => void;
  pending?: boolean;
  tone?: ButtonTone;
  size?: 'sm' | 'md';
}) {
  const [asking, setAsking] = useState(false);
  const confirmRef = useRef<HTMLButtonElement>(null);
  const triggerRef = useRef<HTMLButtonElement>(null);
  const returnFocus = useRef(false);

  useEffect(() => {
    if (asking) confirmRef.current?.focus();
    else if (returnFocus.current) {
      returnFocus.current = false;
      triggerRef.current?.focus();
    }
  }, [asking]);

  function cancel() {
    returnFocus.current = true;
    setAsking(false);
  }

  if (!asking) {
    return (
      <Button ref={triggerRef} tone={tone} size={size} onClick={() => setAsking(true)} disabled={pending}>
        {label}
      </Button>
    );
  }
  return (
    <span
      role="group"
      aria-label={question}
      className="inline-flex flex-wrap items-center gap-2"
      onKeyDown={(e: KeyboardEvent) => e.key === 'Escape' && cancel()}
    >
      <span className="text-sm">{question}</span>
      <Button
        ref={confirmRef}
        tone={tone}
        size={size}
        disabled={pending}
        onClick={() => {
          onConfirm();
          returnFocus.current = true;
          setAsking(false);
        }}
      >
        {pending ? 'Working…' : confirmLabel}
      </Button>
      <Button tone="quiet" size={size} onClick={cancel}>
        Cancel
      </Button>
    </span>
  );
}
