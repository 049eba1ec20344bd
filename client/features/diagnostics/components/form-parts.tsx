import { Button } from '../../../components/button.tsx';
import { SelectField } from '../../../components/form-field.tsx';
import type { DiagnosticsParams } from '@shared/contract/diagnostics.ts';

const AGGREGATES = ['mean', 'median', 'last', 'min', 'max'] as const;

/** The "Aggregate per step" choice shared by the analysis forms (how readings in one grid cell become one value). */
export function AggregateSelect({ value, onChange }: { value: DiagnosticsParams['agg']; onChange: (agg: DiagnosticsParams['agg']) => void }) {
  return (
    <SelectField label="Aggregate per step" value={value} onChange={(e) => onChange(e.target.value as DiagnosticsParams['agg'])}>
      {AGGREGATES.map((a) => (
        <option key={a} value={a}>
          {a}
        </option>
      ))}
    </SelectField>
  );
}

/** An analysis form's `field: reason` message (announced at once) and its submit button, disabled while a run is in flight. */
export function FormFooter({ error, submitLabel, running }: { error: string | null; submitLabel: string; running: boolean }) {
  return (
    <>
      {error && (
        <p role="alert" className="text-sm text-alert">
          {error}
        </p>
      )}
      <div>
        <Button type="submit" tone="primary" disabled={running}>
          {submitLabel}
        </Button>
      </div>
    </>
  );
}
