import type { AlertRule } from '@shared/contract/alerts.ts';
import { RULE_BLIND_WORDS } from '@shared/contract/words/alerts.ts';
import { Instant } from '../../../components/clock/instant.tsx';
import { RULE_BLIND_MEANS, RULE_NOT_WATCHING, RULE_NOTHING_JUDGED, RULE_WATCHING } from '../messages.ts';

/**
 * Whether a rule is watching its channel, as the evaluator last recorded it: "Watching — last
 * judged 14:05 UTC+01:00" in quiet ink, or a warning box "Not watching since … — the logger has
 * gone quiet" with the recorded detail and what it means. Times through `<Instant>` on the
 * logger's clock (or the one the person chose). Nothing for silence rules (a silent target is
 * their alert) and rules turned off. A note with its own accessible name, so a screen reader
 * can find the health of each rule.
 */
export function RuleHealthLine({ rule, loggerZone }: { rule: AlertRule; loggerZone?: string | null }) {
  if (rule.kind === 'silence' || !rule.enabled) return null;
  const { lastJudgedAt, notWatching } = rule.health;
  if (!notWatching) {
    return (
      <p role="note" aria-label={`Health of ${rule.name}`} className="text-sm text-ink-soft">
        <span className="mr-1 inline-block size-2 rounded-full bg-lichen align-middle" aria-hidden="true" />
        {RULE_WATCHING} — last judged <Instant at={lastJudgedAt} kind="readings" loggerZone={loggerZone} never={RULE_NOTHING_JUDGED} />
      </p>
    );
  }
  return (
    <div role="note" aria-label={`Health of ${rule.name}`} className="grid gap-1 rounded-lg border-2 border-amber bg-amber/10 px-3 py-2 text-sm text-ink">
      <p className="font-medium">
        <span className="mr-1 inline-block size-2 rotate-45 bg-amber align-middle" aria-hidden="true" />
        {RULE_NOT_WATCHING} since <Instant at={notWatching.since} kind="readings" loggerZone={loggerZone} /> — {RULE_BLIND_WORDS[notWatching.reason]}
      </p>
      <p className="text-ink-soft">
        {notWatching.detail} {RULE_BLIND_MEANS}
      </p>
      {lastJudgedAt !== null && (
        <p className="text-ink-soft">
          Last judged <Instant at={lastJudgedAt} kind="readings" loggerZone={loggerZone} />
        </p>
      )}
    </div>
  );
}
