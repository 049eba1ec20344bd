/** The caution shown wherever alert rules are made: Lagbook's alerts are no certified alarm. */
export function AlertCaution() {
  return (
    <aside aria-label="Alert caution" className="rounded-lg border border-amber bg-amber/10 p-3 text-sm">
      <strong>Alerts can be late or missing.</strong> Lagbook’s alerts depend on networks and mail delivery and are no replacement for a certified alarm system
      on critical equipment. Follow your lab’s own safety rules and local regulations.
    </aside>
  );
}
