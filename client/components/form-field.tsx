import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes } from 'react';

interface FieldFrame {
  label: string;
  hint?: ReactNode;
  error?: string;
}

// min-h-11: 44 px, a touch target a finger can hit (WCAG 2.2 SC 2.5.5's size)
const CONTROL = 'mt-1 block min-h-11 w-full min-w-0 rounded-lg border bg-card px-3 py-2 text-ink aria-[invalid=true]:border-alert border-rule';

/** Label, control, hint and error of one form field, wired together for assistive technology. */
function Frame({ id, label, hint, error, children }: FieldFrame & { id: string; children: ReactNode }) {
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      {children}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="mt-1 text-sm text-alert">
          {error}
        </p>
      )}
    </div>
  );
}

/** The id of a field's control and the ARIA attributes that tie its hint and error to it. */
function useControlWiring(frame: FieldFrame) {
  const id = useId();
  const describedBy = [frame.hint ? `${id}-hint` : null, frame.error ? `${id}-error` : null].filter(Boolean).join(' ');
  return {
    id,
    'aria-invalid': frame.error ? true : undefined,
    'aria-describedby': describedBy || undefined,
  };
}

/**
 * A labelled text input. Takes react-hook-form's `register()` result (including its ref) as
 * ordinary props; `error` marks the input invalid and is read out with it.
 */
export function TextField({
  label,
  hint,
  error,
  ref,
  className = '',
  ...input
}: FieldFrame & InputHTMLAttributes<HTMLInputElement> & { ref?: Ref<HTMLInputElement> }) {
  const wiring = useControlWiring({ label, hint, error });
  return (
    <Frame id={wiring.id} label={label} hint={hint} error={error}>
      <input ref={ref} {...wiring} className={`${CONTROL} ${className}`} {...input} />
    </Frame>
  );
}

/** A labelled select; same wiring as {@link TextField}. */
export function SelectField({
  label,
  hint,
  error,
  ref,
  className = '',
  children,
  ...select
}: FieldFrame & SelectHTMLAttributes<HTMLSelectElement> & { ref?: Ref<HTMLSelectElement> }) {
  const wiring = useControlWiring({ label, hint, error });
  return (
    <Frame id={wiring.id} label={label} hint={hint} error={error}>
      <select ref={ref} {...wiring} className={`${CONTROL} ${className}`} {...select}>
        {children}
      </select>
    </Frame>
  );
}
