import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { SelectField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { timeZoneChoices } from '../../../components/time-zone-select.tsx';
import { browserTimeZone } from '../../../components/clock/policy.ts';
import { CLOCK_CHOICES, type ClockChoice, type Me } from '@shared/contract/me.ts';
import { useUpdateMe } from '../api/update-me.ts';

const NOT_SET = '';

/** How each clock choice is offered, in plain words (`zone`: the person's own zone). */
const CLOCK_WORDS: Record<ClockChoice, (zone: string) => { label: string; hint: string }> = {
  logger: () => ({
    label: "The logger's clock",
    hint: 'Readings, charts, alerts and uploads on the clock of the logger that took them; everything else on your clock.',
  }),
  mine: (zone) => ({ label: `My clock (${zone.replaceAll('_', ' ')})`, hint: 'Every time on your own clock, whichever logger took it.' }),
  utc: () => ({ label: 'UTC', hint: 'Every time in Coordinated Universal Time, the same for everyone.' }),
};

/**
 * The signed-in person's own settings: name and address come from the identity provider (shown,
 * not edited here); their time zone and which clock times are shown on, in the app and in alert
 * mails, are theirs to choose. Choosing "my clock" with no zone set saves the browser's zone, so
 * mails (which never see the browser) use the same clock as the pages.
 */
export function AccountSettings({ me }: { me: Me }) {
  const update = useUpdateMe();
  const [zone, setZone] = useState(me.user.timeZone ?? NOT_SET);
  const [clock, setClock] = useState<ClockChoice>(me.user.clock);
  const guess = browserTimeZone();
  const myZone = zone === NOT_SET ? guess : zone;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    update.mutate({ timeZone: zone === NOT_SET ? (clock === 'mine' ? guess : null) : zone, clock });
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
      <form onSubmit={submit} className="grid gap-4">
        <fieldset className="grid gap-1">
          <legend className="mb-1 font-medium">Show times on</legend>
          <p className="mb-1 text-sm text-ink-soft">
            This decides the clock of every date and time Lagbook shows you, on its pages and in alert mails; each time names its zone.
          </p>
          {CLOCK_CHOICES.map((c) => {
            const words = CLOCK_WORDS[c](myZone);
            return (
              <label key={c} className="flex min-h-11 cursor-pointer items-start gap-3 py-1">
                <input
                  type="radio"
                  name="clock"
                  value={c}
                  checked={clock === c}
                  onChange={() => {
                    setClock(c);
                    update.reset();
                  }}
                  className="mt-1 h-5 w-5 accent-lichen-dark"
                />
                <span>
                  <span className="block">{words.label}</span>
                  <span className="block text-sm text-ink-soft">{words.hint}</span>
                </span>
              </label>
            );
          })}
        </fieldset>
        <SelectField
          label="Your time zone"
          hint={`Your clock. When not set, your browser's zone is used (it says ${guess.replaceAll('_', ' ')}).`}
          value={zone}
          onChange={(e) => {
            setZone(e.target.value);
            update.reset();
          }}
        >
          <option value={NOT_SET}>Not set (your browser's zone)</option>
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
