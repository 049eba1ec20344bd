import { SelectField, TextField } from '../../../components/form-field.tsx';
import type { RuleFormState } from './rule-form-input.ts';
import { EarlyWarningFields } from './early-warning-fields.tsx';

type FieldChange = (e: { target: { value: string } }) => void;

/**
 * The fields of a rule that may change after it is made — reminder delay and the parameters of
 * its kind — shared by the new-rule form and the change form. `unit` is the watched channel's.
 */
export function RuleParamFields({
  f,
  set,
  err,
  unit,
}: {
  f: RuleFormState;
  set: (key: keyof RuleFormState) => FieldChange;
  err: (key: string) => string | undefined;
  unit: string;
}) {
  return (
    <>
      <TextField
        label="Remind after (minutes, empty: lab default, 0: never)"
        type="number"
        inputMode="numeric"
        value={f.reminderAfterMin}
        onChange={set('reminderAfterMin')}
        error={err('reminderAfterMin')}
      />
      {f.kind === 'bounds' && (
        <>
          <TextField
            label={`Low limit${unit ? ` (${unit})` : ''}`}
            type="number"
            inputMode="decimal"
            value={f.low}
            onChange={set('low')}
            error={err('params.low')}
          />
          <TextField
            label={`High limit${unit ? ` (${unit})` : ''}`}
            type="number"
            inputMode="decimal"
            value={f.high}
            onChange={set('high')}
            error={err('params.high')}
          />
          <TextField
            label="Hold time (seconds outside before it fires)"
            type="number"
            inputMode="numeric"
            value={f.holdS}
            onChange={set('holdS')}
            error={err('params.holdS')}
            hint="So that one noisy reading pages nobody."
          />
          <EarlyWarningFields f={f} set={set} err={err} />
        </>
      )}
      {f.kind === 'silence' && (
        <TextField
          label="Silent for more than (× expected interval)"
          type="number"
          inputMode="decimal"
          value={f.factor}
          onChange={set('factor')}
          error={err('params.factor')}
        />
      )}
      {f.kind === 'rate' && (
        <>
          <TextField
            label={`Largest change per minute${unit ? ` (${unit})` : ''}`}
            type="number"
            inputMode="decimal"
            value={f.maxPerMinute}
            onChange={set('maxPerMinute')}
            error={err('params.maxPerMinute')}
          />
          <SelectField label="Direction" value={f.direction} onChange={set('direction')} error={err('params.direction')}>
            <option value="either">Rises and falls</option>
            <option value="rise">Rises only</option>
            <option value="fall">Falls only</option>
          </SelectField>
        </>
      )}
      {f.kind === 'unusual' && (
        <>
          <TextField label="Cycle (hours)" type="number" inputMode="decimal" value={f.periodH} onChange={set('periodH')} error={err('params.periodH')} />
          <TextField
            label="Robust SDs off the usual pattern"
            type="number"
            inputMode="decimal"
            value={f.k}
            onChange={set('k')}
            error={err('params.k')}
            hint="The usual daily shape is learnt from recent cycles (STL), so a normal afternoon peak does not count."
          />
          <TextField
            label="Cycles of history"
            type="number"
            inputMode="numeric"
            value={f.historyCycles}
            onChange={set('historyCycles')}
            error={err('params.historyCycles')}
          />
        </>
      )}
    </>
  );
}
