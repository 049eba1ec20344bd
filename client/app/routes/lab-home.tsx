import { LabOverview } from '../../features/labs/components/lab-overview.tsx';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab`: the lab's overview. */
export default function LabHomeRoute() {
  const { detail } = useLabContext();
  return (
    <section aria-labelledby="lab-overview-heading">
      <h2 id="lab-overview-heading" className="sr-only">
        Overview
      </h2>
      <LabOverview detail={detail} />
    </section>
  );
}
