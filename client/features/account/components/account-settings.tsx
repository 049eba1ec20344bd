import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { SelectField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { browserTimeZone, timeZoneChoices } from '../../../components/time-zone-select.tsx';
import type { Me } from '@shared/contract/me.ts';
import { useUpdateMe } from '../api/update-me.ts';

const NOT_SET = '';

/**
 * The signed-in person's own settings: name and address come from the identity provider (shown,
 * not edited here); the time zone is theirs to choose, and alert mails then give each time on
 * their clock as well as on the logger's and in UTC.
 */
export function AccountSettings({ me }: { me: Me }) {
  const update = useUpdateMe();
  const [zone, setZone] = useState(me.user.timeZone ?? NOT_SET);
  const guess = browserTimeZone();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    update.mutate({ timeZone: zone === NOT_SET ? null : zone });
  };
  return (
    <div className="grid max-w-2xl gap-6">
      <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 text-sm">
        <dt className="text-ink-soft">Name</dt>
        <dd>{me.user.name}</dd>
        <dt className="text-ink-soft">E-mail</dt>
        <dd>{me.user.email}</dd>
      </dl>
      <p className="text-sm text-ink-soft">Name and e-mail come from your sign-in provider; change them there.</p>
      <form onSubmit={submit} className="grid gap-3">
        <SelectField
          label="Your time zone"
          hint={`Alert mails give each time on the logger's clock and in UTC; with a zone here they add your own clock. Your browser says ${guess}.`}
          value={zone}
          onChange={(e) => {
            setZone(e.target.value);
            update.reset();
          }}
        >
          <option value={NOT_SET}>Not set (the logger's clock and UTC only)</option>
          {timeZoneChoices(me.user.timeZone ?? undefined, guess).map((z) => (
            <option key={z} value={z}>
              {z.replaceAll('_', ' ')}
            </option>
          ))}
        </SelectField>
        <div>
          <Button tone="primary" type="submit" disabled={update.isPending}>
            Save
          </Button>
        </div>
        {update.isSuccess && <Notice tone="status">Saved.</Notice>}
        {update.isError && <Notice tone="alert">{update.error.message}</Notice>}
      </form>
    </div>
  );
}
