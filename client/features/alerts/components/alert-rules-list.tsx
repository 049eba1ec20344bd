import { useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { ConfirmButton } from '../../../components/confirm-button.tsx';
import { useDeleteAlertRule } from '../api/delete-alert-rule.ts';
import type { AlertRule } from '@shared/contract/alerts.ts';
import { useSetAlertSubscription } from '../api/set-alert-subscription.ts';
import { useUpdateAlertRule } from '../api/update-alert-rule.ts';
import { describeAlertRule } from './alert-rule-describe.ts';
import { AlertRuleEditForm } from './alert-rule-edit-form.tsx';
import { deleteRuleQuestion } from '../messages.ts';
import { RuleHealthLine } from './rule-health-line.tsx';

/** The IANA zone of a rule's logger (its health times show on that clock by default). */
type RuleZone = (rule: AlertRule) => string | null | undefined;

/** One rule: what it watches and for what, whether it is firing and watching; subscribe, change, turn off/on, delete. */
function RuleItem({
  slug,
  rule,
  canManage,
  canSubscribe,
  zoneOf,
}: {
  slug: string;
  rule: AlertRule;
  canManage: boolean;
  canSubscribe: boolean;
  zoneOf?: RuleZone;
}) {
  const subscribe = useSetAlertSubscription(slug, rule.id);
  const update = useUpdateAlertRule(slug, rule.id);
  const remove = useDeleteAlertRule(slug, rule.id);
  const [changing, setChanging] = useState(false);
  const where = rule.watched.channelId === null ? rule.watched.label : `${rule.watched.loggerName} · ${rule.watched.label}`;
  return (
    <li className="grid gap-2 border-b border-rule py-3 sm:grid-cols-[1fr_auto] sm:items-center">
      <div>
        <p className="font-medium">
          {rule.name}
          {!rule.enabled && <span className="ml-2 rounded bg-rule px-1.5 py-0.5 text-xs">off</span>}
          {rule.openAlertId !== null && <span className="ml-2 rounded bg-alert px-1.5 py-0.5 text-xs text-white">firing</span>}
          {rule.enabled && rule.health.notWatching !== null && (
            <span className="ml-2 rounded border border-amber bg-amber/20 px-1.5 py-0.5 text-xs">not watching</span>
          )}
        </p>
        <p className="text-sm text-ink-soft">
          {where} — {describeAlertRule(rule)}
        </p>
        <div className="mt-1">
          <RuleHealthLine rule={rule} loggerZone={zoneOf?.(rule)} />
        </div>
      </div>
      <div className="flex flex-wrap gap-2">
        {canSubscribe && (
          <Button size="sm" disabled={subscribe.isPending} onClick={() => subscribe.mutate(!rule.subscribed)} aria-pressed={rule.subscribed}>
            {rule.subscribed ? 'Mail me: on' : 'Mail me: off'}
          </Button>
        )}
        {canManage && (
          <>
            <Button size="sm" aria-expanded={changing} onClick={() => setChanging((open) => !open)}>
              Change
            </Button>
            <Button size="sm" disabled={update.isPending} onClick={() => update.mutate({ enabled: !rule.enabled })}>
              {rule.enabled ? 'Turn off' : 'Turn on'}
            </Button>
            <ConfirmButton
              label="Delete"
              question={deleteRuleQuestion(rule.name)}
              confirmLabel="Delete rule"
              pending={remove.isPending}
              onConfirm={() => remove.mutate(undefined)}
            />
          </>
        )}
      </div>
      {canManage && changing && <AlertRuleEditForm slug={slug} rule={rule} onDone={() => setChanging(false)} />}
    </li>
  );
}

/** The lab's alert rules, each with whether it is watching. */
export function AlertRulesList({
  slug,
  rules,
  canManage,
  canSubscribe,
  zoneOf,
}: {
  slug: string;
  rules: AlertRule[];
  canManage: boolean;
  canSubscribe: boolean;
  zoneOf?: RuleZone;
}) {
  if (rules.length === 0) return <p className="text-sm text-ink-soft">No alert rules yet.</p>;
  return (
    <ul aria-label="Alert rules" className="grid">
      {rules.map((r) => (
        <RuleItem key={r.id} slug={slug} rule={r} canManage={canManage} canSubscribe={canSubscribe} zoneOf={zoneOf} />
      ))}
    </ul>
  );
}
