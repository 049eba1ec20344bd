import type { UseFormRegisterReturn } from 'react-hook-form';
import { TextField } from '../../../components/form-field.tsx';
import { optionalNumber } from '../../../components/form-numbers.ts';

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
 * `keyHint` explains the key box (e.g. what renaming a key means for the logger).
 */
export function ChannelFields({
  register,
  errors,
  keyHint = 'What the logger sends, e.g. air_t.',
  labelPrefix = '',
}: {
  register: (name: ChannelFieldName, options?: ChannelFieldOptions) => UseFormRegisterReturn;
  errors: Partial<Record<ChannelFieldName, { message?: string }>> | undefined;
  keyHint?: string;
  /** Prepended to every label ("Channel 2 ") so repeated fields stay distinguishable. */
  labelPrefix?: string;
}) {
  const field = (name: ChannelFieldName) => ({ error: errors?.[name]?.message, ...register(name, OPTIONS[name]) });
  const label = (text: string) => (labelPrefix ? `${labelPrefix}${text}` : `${text[0].toUpperCase()}${text.slice(1)}`);
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      <TextField label={label('key')} className="font-mono" autoComplete="off" spellCheck={false} hint={keyHint} {...field('key')} />
      <TextField label={label('label')} autoComplete="off" {...field('label')} />
      <TextField label={label('unit')} autoComplete="off" hint="e.g. °C, %, ppm" {...field('unit')} />
      <TextField label={label('quantity')} autoComplete="off" hint="e.g. air temperature" {...field('quantity')} />
      <TextField label={label('valid minimum')} inputMode="decimal" {...field('validMin')} />
      <TextField label={label('valid maximum')} inputMode="decimal" {...field('validMax')} />
      <TextField label={label('expected interval (s)')} inputMode="numeric" hint="Empty: the logger's interval." {...field('expectedIntervalS')} />
      <TextField
        label={label('seasonal period hint')}
        inputMode="numeric"
        hint="Readings per cycle, e.g. 144 for a day of 10-minute readings."
        {...field('seasonalPeriodHint')}
      />
    </div>
  );
}
