import { useId } from 'react';
import { TextField } from '../../../components/form-field.tsx';
import type { RuleFormState } from './rule-form-input.ts';
import { LOOK_AHEAD_LABEL, WARN_AT_CHANCE_LABEL, WARN_BEFORE_LIMIT, WARN_BEFORE_LIMIT_HINT, EARLY_WARNING_CAUTION } from './early-warning-words.ts';

type FieldChange = (e: { target: { value: string } }) => void;

/**
 * The opt-in early warning of a bounds rule: a box, and when it is ticked the look-ahead in
 * minutes and the chance (percent) at which to warn, with the caution that it is an aid only.
 */
export function EarlyWarningFields({
  f,
  set,
  err,
}: {
  f: RuleFormState;
  set: (key: keyof RuleFormState) => FieldChange;
  err: (key: string) => string | undefined;
}) {
  const id = useId();
  const on = f.earlyWarning === 'on';
  return (
    <fieldset className="grid gap-2 rounded-lg border border-rule p-3">
      <legend className="sr-only">{WARN_BEFORE_LIMIT}</legend>
      <label htmlFor={id} className="flex items-center gap-2 font-medium">
        <input id={id} type="checkbox" checked={on} onChange={(e) => set('earlyWarning')({ target: { value: e.target.checked ? 'on' : 'off' } })} />
        {WARN_BEFORE_LIMIT}
      </label>
      <p className="text-sm text-ink-soft">{WARN_BEFORE_LIMIT_HINT}</p>
      {on && (
        <>
          <TextField
            label={LOOK_AHEAD_LABEL}
            type="number"
            inputMode="numeric"
            value={f.horizonMin}
            onChange={set('horizonMin')}
            error={err('params.earlyWarning.horizonMin')}
          />
          <TextField
            label={WARN_AT_CHANCE_LABEL}
            type="number"
            inputMode="decimal"
            value={f.chancePct}
            onChange={set('chancePct')}
            error={err('params.earlyWarning.chance')}
          />
          <p className="text-sm text-ink-soft">{EARLY_WARNING_CAUTION}</p>
        </>
      )}
    </fieldset>
  );
}
