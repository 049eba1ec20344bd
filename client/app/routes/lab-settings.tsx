import { useNavigate } from 'react-router-dom';
import { LabSettingsPage } from '../../features/labs/components/lab-settings-page.tsx';
import { labDeletedState } from '../../features/labs/components/lab-deleted-notice.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { paths } from '../paths.ts';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/settings`: rename, describe, export and delete the lab (admins). After a deletion: the labs list, with a notice. */
export default function LabSettingsRoute() {
  const { detail } = useLabContext();
  const navigate = useNavigate();
  if (!detail.permissions.includes('lab.manage')) return <MissingPermission what="the lab's settings" />;
  return (
    <LabSettingsPage
      lab={detail.lab}
      onDeleted={(done) => navigate(paths.home.href(), { replace: true, state: labDeletedState(done.deletion.labName, done.deletion.subscriptionCancelled) })}
    />
  );
}
