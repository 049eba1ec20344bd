import { needsSafetyCaution, type MeasuredThing } from './safety-caution.ts';

/** A short reminder, on cold-store and gas channels, that Lagbook's status is not a certified alarm. */
export function SafetyCautionNote({ channel }: { channel: MeasuredThing }) {
  if (!needsSafetyCaution(channel)) return null;
  return (
    <aside aria-label="Safety note" className="rounded-lg border border-amber bg-amber/10 p-3 text-sm">
      <strong>Not an alarm system.</strong> Lagbook’s readings and statuses for this channel are not a certified alarm: they can arrive late or not at all. Your
      lab’s own safety rules, alarm equipment and local regulations apply.
    </aside>
  );
}
