import { useId, useState } from 'react';
import { Button, buttonClasses } from '../../../components/button.tsx';
import { Notice } from '../../../components/notice.tsx';
import type { LabDeletionStarted } from '@shared/contract/labs.ts';
import { useDeleteLab } from '../api/delete-lab.ts';
import { labExportUrl } from '../api/export-lab.ts';

/**
 * The danger section: deleting the lab (admins). It says what will happen, offers the full
 * export first, and asks for the lab's name typed again; the button stays off until the name
 * matches. The server checks the name too, and refuses while an invoice is unpaid (its message
 * says what to do). `onDeleted` takes the person away from the lab's pages.
 */
export function LabSettingsDeletion({ lab, onDeleted }: { lab: { slug: string; name: string }; onDeleted: (done: LabDeletionStarted) => void }) {
  const remove = useDeleteLab(lab.slug);
  const [open, setOpen] = useState(false);
  const [typed, setTyped] = useState('');
  const inputId = useId();
  const matches = typed.trim() === lab.name;

  return (
    <section aria-labelledby={`${inputId}-title`} className="max-w-xl rounded-xl border border-alert/40 bg-card p-5">
      <h2 id={`${inputId}-title`} className="text-lg font-semibold text-alert">
        Delete this lab
      </h2>
      <p className="mt-2 text-sm">Deleting the lab cannot be undone. At once:</p>
      <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
        <li>nobody can open it any more, and it leaves everyone’s list of labs;</li>
        <li>its logger keys, personal tokens and open invitations stop working;</li>
        <li>its paid subscription, if any, is cancelled;</li>
        <li>its readings, loggers, channels, alerts, notes, members and audit log are removed (this runs in the background).</li>
      </ul>
      <p className="mt-3 text-sm">Take a full export first if you may need the data later: settings as JSON and every channel’s readings as CSV, in one zip.</p>
      <a href={labExportUrl(lab.slug)} download className={`mt-2 ${buttonClasses('secondary', 'sm')}`}>
        Download the full export first
      </a>
      {!open ? (
        <div className="mt-5">
          <Button tone="danger" onClick={() => setOpen(true)}>
            Delete this lab…
          </Button>
        </div>
      ) : (
        <form
          className="mt-5 grid gap-3"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            if (matches) remove.mutate({ confirmName: typed }, { onSuccess: onDeleted });
          }}
        >
          <div>
            <label htmlFor={inputId} className="block text-sm font-medium">
              Type the lab’s name, <span className="font-semibold">{lab.name}</span>, to confirm
            </label>
            <input
              id={inputId}
              autoComplete="off"
              spellCheck={false}
              value={typed}
              onChange={(e) => setTyped(e.target.value)}
              className="mt-1 block w-full rounded-lg border border-rule bg-card px-3 py-2 text-ink"
            />
          </div>
          {remove.isError && <Notice tone="alert">{remove.error.message}</Notice>}
          <div className="flex flex-wrap gap-3">
            <Button type="submit" tone="danger" disabled={!matches || remove.isPending}>
              {remove.isPending ? 'Deleting…' : 'Delete the lab for good'}
            </Button>
            <Button
              tone="quiet"
              onClick={() => {
                setOpen(false);
                setTyped('');
                remove.reset();
              }}
            >
              Keep the lab
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
