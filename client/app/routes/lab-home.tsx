import { LabOverview, type OverviewHelpers } from '../../features/labs/components/lab-overview.tsx';
import { useOverview } from '../../features/labs/api/get-overview.ts';
import { needsSafetyCaution } from '../../components/safety-caution.ts';
import { SafetyCautionNote } from '../../components/safety-caution-note.tsx';
import { isReasonCode, REASON_LABELS } from '../../features/quarantine/components/reason-labels.ts';
import { useLabContext } from './lab-context.ts';

/** What the overview borrows from the channels and quarantine features. */
const helpers: OverviewHelpers = {
  reasonLabel: (reason) => (isReasonCode(reason) ? REASON_LABELS[reason] : reason.replace(/_/g, ' ')),
  needsCaution: (c) => needsSafetyCaution({ label: c.label, key: c.key, quantity: c.quantity, unit: c.unit }),
  CautionNote: ({ channel }) => <SafetyCautionNote channel={{ label: channel.label, key: channel.key, quantity: channel.quantity, unit: channel.unit }} />,
};

/** `/labs/:lab`: the lab's overview — what needs attention, the lab's facts, its sections. */
export default function LabHomeRoute() {
  const { detail } = useLabContext();
  const overview = useOverview(detail.lab.slug);
  return (
    <section aria-labelledby="lab-overview-heading">
      <h2 id="lab-overview-heading" className="sr-only">
        Overview
      </h2>
      <LabOverview detail={detail} overview={overview.data} failed={overview.isError} helpers={helpers} />
    </section>
  );
}
