import { useState, type FormEvent } from 'react';
import { AUDIT_ACTIONS, type AuditAction } from '@shared/contract/audit.ts';
import { Button } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { DateInput } from '../../../components/date-time-input.tsx';
import { DATE_TIME_MESSAGES, readDay } from '../../../components/date-time-input-read.ts';
import { NO_AUDIT_FILTERS, type AuditFilters } from '../hooks/audit-search-params.ts';
import { AUDIT_ACTION_LABELS } from './audit-action-labels.ts';

/**
 * The audit log's filters: action, who did it (name or e-mail, any part) and a range of
 * days. Applying starts again at page 1; Clear shows the whole log.
 */
export function AuditFilterForm({ filters, onApply }: { filters: AuditFilters; onApply: (next: AuditFilters) => void }) {
  const [draft, setDraft] = useState(filters);
  const [rangeError, setRangeError] = useState<string | undefined>();
  const [fromError, setFromError] = useState<string | undefined>();

  function submit(e: FormEvent) {
    e.preventDefault();
    const from = readDay(draft.from);
    const to = readDay(draft.to);
    setFromError(from.ok ? undefined : from.problem);
    if (!to.ok) return setRangeError(to.problem);
    if (from.ok && from.day && to.day && from.day > to.day) return setRangeError(DATE_TIME_MESSAGES.rangeOrder);
    setRangeError(undefined);
    if (!from.ok) return;
    onApply({ ...draft, from: from.day ?? '', to: to.day ?? '', actor: draft.actor.trim(), page: 1 });
  }

  return (
    <form
      onSubmit={submit}
      aria-label="Filter the audit log"
      className="grid gap-4 rounded-xl border border-rule bg-card p-4 sm:grid-cols-2 lg:grid-cols-[1.2fr_1.5fr_1fr_1fr_auto]"
    >
      <SelectField label="Action" value={draft.action} onChange={(e) => setDraft({ ...draft, action: e.target.value as AuditAction | '' })}>
        <option value="">Any action</option>
        {AUDIT_ACTIONS.map((action) => (
          <option key={action} value={action}>
            {AUDIT_ACTION_LABELS[action]}
          </option>
        ))}
      </SelectField>
      <TextField label="Done by" placeholder="Name or e-mail" value={draft.actor} onChange={(e) => setDraft({ ...draft, actor: e.target.value })} />
      <DateInput label="From day" value={draft.from} error={fromError} onChange={(from) => setDraft({ ...draft, from })} />
      <DateInput label="To day" value={draft.to} error={rangeError} onChange={(to) => setDraft({ ...draft, to })} />
      <div className="flex items-end gap-2">
        <Button type="submit" tone="primary">
          Apply
        </Button>
        <Button
          onClick={() => {
            setDraft(NO_AUDIT_FILTERS);
            setRangeError(undefined);
            setFromError(undefined);
            onApply(NO_AUDIT_FILTERS);
          }}
        >
          Clear
        </Button>
      </div>
    </form>
  );
}
