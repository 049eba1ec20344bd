import type { UseFormRegisterReturn } from 'react-hook-form';
import { TextField } from '../../../components/form-field.tsx';
import { optionalNumber } from '../../../components/form-numbers.ts';
import { CHANNEL_LABELS } from '@shared/contract/words/loggers.ts';
import { ordinal } from '@shared/contract/words/fields.ts';
import { IN_SECONDS } from '../messages.ts';

export type ChannelFieldName = 'key' | 'label' | 'unit' | 'quantity' | 'validMin' | 'validMax' | 'expectedIntervalS' | 'seasonalPeriodHint';

/** How a field is read from its box (react-hook-form's `setValueAs`). */
export interface ChannelFieldOptions {
  setValueAs?: (value: unknown) => unknown;
}

/** How each channel field is read from its box: the numeric ones as numbers, empty meaning "not set". */
const OPTIONS: Partial<Record<ChannelFieldName, ChannelFieldOptions>> = {
  validMin: { setValueAs: optionalNumber },
  validMax: { setValueAs: optionalNumber },
  expectedIntervalS: { setValueAs: optionalNumber },
  seasonalPeriodHint: { setValueAs: optionalNumber },
};

/** Default values of an empty channel, as the form holds them. */
export const EMPTY_CHANNEL = {
  key: '',
  label: '',
  unit: '',
  quantity: '',
  validMin: null,
  validMax: null,
  expectedIntervalS: null,
  seasonalPeriodHint: null,
};

/**
 * The boxes of one channel (key, label, unit, quantity, valid range, expected interval and
 * seasonal period hint), used by the register form's channel list and by the add / edit
 * channel form. `register(name, options)` binds a field wherever the caller keeps it;
 * `keyHint` explains the key box (e.g. what renaming a key means for the logger). Labels are the
 * shared loggers words, so a refusal the server words ("Lowest valid value (2nd channel): …")
 * names the box as the form does; `position` adds the channel's place in a list.
 */
export function ChannelFields({
  register,
  errors,
  keyHint = 'What the logger sends, e.g. air_t.',
  position,
}: {
  register: (name: ChannelFieldName, options?: ChannelFieldOptions) => UseFormRegisterReturn;
  errors: Partial<Record<ChannelFieldName, { message?: string }>> | undefined;
  keyHint?: string;
  /** The channel's place in a list (from 1): labels end in "(2nd channel)" so repeated fields stay distinguishable. */
  position?: number;
}) {
  const field = (name: ChannelFieldName) => ({ error: errors?.[name]?.message, ...register(name, OPTIONS[name]) });
  // a list position as the server's refusals say it ("Lowest valid value (2nd channel)")
  const label = (text: string) => (position === undefined ? text : `${text} (${ordinal(position)} channel)`);
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      <TextField label={label(CHANNEL_LABELS.key)} className="font-mono" autoComplete="off" spellCheck={false} hint={keyHint} {...field('key')} />
      <TextField label={label(CHANNEL_LABELS.label)} autoComplete="off" {...field('label')} />
      <TextField label={label(CHANNEL_LABELS.unit)} autoComplete="off" hint="e.g. °C, %, ppm" {...field('unit')} />
      <TextField label={label(CHANNEL_LABELS.quantity)} autoComplete="off" hint="e.g. air temperature" {...field('quantity')} />
      <TextField label={label(CHANNEL_LABELS.validMin)} inputMode="decimal" {...field('validMin')} />
      <TextField label={label(CHANNEL_LABELS.validMax)} inputMode="decimal" {...field('validMax')} />
      <TextField
        label={label(`${CHANNEL_LABELS.expectedIntervalS}${IN_SECONDS}`)}
        inputMode="numeric"
        hint="Empty: the logger's interval."
        {...field('expectedIntervalS')}
      />
      <TextField
        label={label(CHANNEL_LABELS.seasonalPeriodHint)}
        inputMode="numeric"
        hint="Readings per cycle, e.g. 144 for a day of 10-minute readings."
        {...field('seasonalPeriodHint')}
      />
    </div>
  );
}
