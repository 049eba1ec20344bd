import { SelectField, TextField } from '../../../components/form-field.tsx';
import type { QuarantineFilters } from '../hooks/quarantine-search-params.ts';
import { REASON_CODES, REASON_LABELS, type ReasonCode } from './reason-labels.ts';
import { UNLISTED_LOGGER } from '../messages.ts';

/**
 * Filters of the quarantine page: which logger, which reason, which channel name as received. A
 * change applies at once (the channel name when the field is left or Enter is pressed) and
 * starts at the newest rows.
 */
export function QuarantineFilterBar({
  filters,
  loggers,
  onChange,
}: {
  filters: QuarantineFilters;
  loggers: Array<{ id: number; name: string }>;
  onChange: (next: QuarantineFilters) => void;
}) {
  return (
    <div role="group" aria-label="Filter the quarantine" className="grid gap-4 rounded-xl border border-rule bg-card p-4 sm:grid-cols-3">
      <SelectField
        label="Logger"
        value={filters.loggerId ?? ''}
        onChange={(e) => onChange({ ...filters, loggerId: e.target.value ? Number(e.target.value) : null, cursor: null })}
      >
        <option value="">Every logger</option>
        {filters.loggerId && !loggers.some((l) => l.id === filters.loggerId) && <option value={filters.loggerId}>{UNLISTED_LOGGER}</option>}
        {loggers.map((l) => (
          <option key={l.id} value={l.id}>
            {l.name}
          </option>
        ))}
      </SelectField>
      <SelectField label="Reason" value={filters.reason} onChange={(e) => onChange({ ...filters, reason: e.target.value as ReasonCode | '', cursor: null })}>
        <option value="">Any reason</option>
        {REASON_CODES.map((code) => (
          <option key={code} value={code}>
            {REASON_LABELS[code]}
          </option>
        ))}
      </SelectField>
      <TextField
        key={filters.channel}
        label="Channel name as received"
        placeholder="any"
        defaultValue={filters.channel}
        maxLength={191}
        onBlur={(e) => e.target.value.trim() !== filters.channel && onChange({ ...filters, channel: e.target.value.trim(), cursor: null })}
        onKeyDown={(e) => {
          if (e.key === 'Enter') e.currentTarget.blur();
        }}
      />
    </div>
  );
}
