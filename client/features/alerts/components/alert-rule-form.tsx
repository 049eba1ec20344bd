import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { useCreateAlertRule } from '../api/create-alert-rule.ts';
import { AlertCaution } from './alert-caution.tsx';
import { EMPTY_RULE_FORM, type RuleFormState } from './rule-form-input.ts';
import { RuleParamFields } from './rule-param-fields.tsx';
import { useRuleForm } from './use-rule-form.ts';
import { ruleMade } from '../messages.ts';

/** A channel that a rule can watch (with its logger, for silence rules on a whole logger). */
export interface RuleTarget {
  id: number;
  label: string;
  unit: string | null;
  loggerId: number;
  loggerName: string;
}

export const KIND_LABELS: Record<RuleFormState['kind'], string> = {
  bounds: 'Readings outside limits',
  silence: 'No readings arrive',
  rate: 'Readings change too fast',
  unusual: 'Unusual reading for the time of day',
};

/**
 * "New alert rule": what to watch, which kind of rule and its parameters, checked with the
 * server's own schema (and the server's refusals shown on the field they name), with the
 * caution beside it that alerts are no certified alarm.
 */
export function AlertRuleForm({ slug, targets, initialChannelId }: { slug: string; targets: RuleTarget[]; initialChannelId?: number }) {
  const create = useCreateAlertRule(slug);
  const { f, setF, set, err, errors, submit } = useRuleForm(() => ({ ...EMPTY_RULE_FORM, target: initialChannelId ? `channel:${initialChannelId}` : '' }));
  const [made, setMade] = useState<string | null>(null);
  const loggers = [...new Map(targets.map((t) => [t.loggerId, t.loggerName])).entries()];
  const unit = targets.find((t) => `channel:${t.id}` === f.target)?.unit ?? '';

  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    setMade(null);
    await submit(async (input) => {
      const { rule } = await create.mutateAsync(input);
      setMade(ruleMade(rule.name, rule.watched.label));
      setF((old) => ({ ...EMPTY_RULE_FORM, target: old.target }));
    });
  }

  return (
    <section aria-labelledby="new-rule-heading" className="grid gap-3 rounded-xl border border-rule bg-card p-4">
      <h3 id="new-rule-heading" className="text-lg font-semibold">
        New alert rule
      </h3>
      <AlertCaution />
      <form noValidate aria-label="New alert rule" onSubmit={onSubmit} className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" placeholder="e.g. Freezer 3 too warm" autoComplete="off" value={f.name} onChange={set('name')} error={err('name')} />
        <SelectField label="Alert when" value={f.kind} onChange={set('kind')} error={err('kind')}>
          {Object.entries(KIND_LABELS).map(([k, label]) => (
            <option key={k} value={k}>
              {label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Watch" value={f.target} onChange={set('target')} error={err('channelId') ?? err('loggerId')}>
          <option value="">Choose a channel…</option>
          {targets.map((t) => (
            <option key={t.id} value={`channel:${t.id}`}>
              {t.loggerName} · {t.label}
            </option>
          ))}
          {f.kind === 'silence' &&
            loggers.map(([id, name]) => (
              <option key={`l${id}`} value={`logger:${id}`}>
                Every channel of {name}
              </option>
            ))}
        </SelectField>
        <RuleParamFields f={f} set={set} err={err} unit={unit} />
        <div className="sm:col-span-2">
          <Button type="submit" tone="primary" disabled={create.isPending}>
            {create.isPending ? 'Saving…' : 'Make rule'}
          </Button>
        </div>
        {errors.body && (
          <Notice tone="alert" className="sm:col-span-2">
            {errors.body}
          </Notice>
        )}
        {made && (
          <Notice tone="status" className="sm:col-span-2">
            {made}
          </Notice>
        )}
      </form>
    </section>
  );
}
