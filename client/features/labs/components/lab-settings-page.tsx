import { buttonClasses } from '../../../components/button.tsx';
import type { LabDeletionStarted, LabDetail } from '@shared/contract/labs.ts';
import { labExportUrl } from '../api/export-lab.ts';
import { LabSettingsForm } from './lab-settings-form.tsx';
import { LabSettingsDeletion } from './lab-settings-deletion.tsx';

/** Lab settings (admins): name and description, the full export, and deleting the lab. */
export function LabSettingsPage({ lab, onDeleted }: { lab: LabDetail['lab']; onDeleted: (done: LabDeletionStarted) => void }) {
  return (
    <div className="grid gap-10">
      <section aria-labelledby="lab-settings-about">
        <h2 id="lab-settings-about" className="text-lg font-semibold">
          Name and description
        </h2>
        <div className="mt-3">
          <LabSettingsForm lab={lab} />
        </div>
      </section>
      <section aria-labelledby="lab-settings-export" className="max-w-xl">
        <h2 id="lab-settings-export" className="text-lg font-semibold">
          Full export
        </h2>
        <p className="mt-2 text-sm text-ink-soft">
          Everything in the lab in one zip: <span className="font-mono">lab.json</span> with the lab, members and roles, loggers, channels with their settings,
          alert rules and notes, and one readings CSV per channel (UTC time, epoch milliseconds, value). Large labs take a while; the download streams.
        </p>
        <a href={labExportUrl(lab.slug)} download className={`mt-3 ${buttonClasses('secondary')}`}>
          Download the full export
        </a>
      </section>
      <LabSettingsDeletion lab={lab} onDeleted={onDeleted} />
    </div>
  );
}
