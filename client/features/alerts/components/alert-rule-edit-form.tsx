import type { FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import type { AlertRule } from '@shared/contract/alerts.ts';
import { useUpdateAlertRule } from '../api/update-alert-rule.ts';
import { KIND_LABELS } from './alert-rule-form.tsx';
import { formFromRule } from './rule-form-input.ts';
import { RuleParamFields } from './rule-param-fields.tsx';
import { useRuleForm } from './use-rule-form.ts';

/**
 * Changing a rule in place: its name, reminder delay and the parameters of its kind, checked with
 * the server's own schema before sending. What it watches and its kind stay (make a new rule for
 * those), so its alert history keeps meaning what it meant.
 */
export function AlertRuleEditForm({ slug, rule, onDone }: { slug: string; rule: AlertRule; onDone: () => void }) {
  const update = useUpdateAlertRule(slug, rule.id);
  const { f, set, err, errors, submit } = useRuleForm(() => formFromRule(rule));
  const where = rule.watched.channelId === null ? rule.watched.label : `${rule.watched.loggerName} · ${rule.watched.label}`;

  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    await submit(async (input) => {
      await update.mutateAsync({ name: input.name, reminderAfterMin: input.reminderAfterMin, params: input.params });
      onDone();
    });
  }

  return (
    <form
      noValidate
      aria-label={`Change the rule ${rule.name}`}
      onSubmit={onSubmit}
      className="grid gap-4 rounded-lg border border-rule bg-card p-3 sm:col-span-2 sm:grid-cols-2"
    >
      <p className="text-sm text-ink-soft sm:col-span-2">
        {KIND_LABELS[rule.kind]} · watches {where}. To watch something else or for another kind, make a new rule.
      </p>
      <TextField label="Name" autoComplete="off" value={f.name} onChange={set('name')} error={err('name')} />
      <RuleParamFields f={f} set={set} err={err} unit={rule.watched.unit} />
      <div className="flex gap-2 sm:col-span-2">
        <Button type="submit" tone="primary" disabled={update.isPending}>
          {update.isPending ? 'Saving…' : 'Save changes'}
        </Button>
        <Button type="button" onClick={onDone}>
          Cancel
        </Button>
      </div>
      {errors.body && (
        <Notice tone="alert" className="sm:col-span-2">
          {errors.body}
        </Notice>
      )}
    </form>
  );
}
