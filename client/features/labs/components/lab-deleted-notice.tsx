import { useLocation } from 'react-router-dom';
import { Notice } from '../../../components/notice.tsx';

/** What the lab settings page hands to the labs list after a deletion (router location state). */
export interface LabDeletedState {
  deletedLab: { name: string; subscriptionCancelled: boolean };
}

/** The router state that tells the labs list a lab was just deleted. */
export function labDeletedState(name: string, subscriptionCancelled: boolean): LabDeletedState {
  return { deletedLab: { name, subscriptionCancelled } };
}

/** On the labs list, right after a deletion: which lab went and what happens next. Nothing otherwise. */
export function LabDeletedNotice() {
  const state = useLocation().state as Partial<LabDeletedState> | null;
  const deleted = state?.deletedLab;
  if (!deleted) return null;
  return (
    <Notice tone="status" className="mb-6">
      The lab <strong>{deleted.name}</strong> was deleted. {deleted.subscriptionCancelled ? 'Its subscription was cancelled. ' : ''}
      Its data is being removed in the background.
    </Notice>
  );
}
