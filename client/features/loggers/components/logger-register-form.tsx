import { useFieldArray, useForm, type FieldPath } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { createLoggerSchema } from '@shared/contract/loggers.ts';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { numberMessages, requiredNumber } from '../../../components/form-numbers.ts';
import { Notice } from '../../../components/notice.tsx';
import { applyServerError } from '../../../components/server-field-error.ts';
import { browserTimeZone, TimeZoneSelect } from '../../../components/time-zone-select.tsx';
import { useCreateLogger, type createLogger } from '../api/create-logger.ts';
import { ChannelFields, EMPTY_CHANNEL, type ChannelFieldName } from './channel-fields.tsx';
import { LOGGER_LABELS } from '@shared/contract/words/loggers.ts';
import { IN_SECONDS } from '../messages.ts';

type RegisterLoggerForm = z.input<typeof createLoggerSchema>;
export type RegisteredLogger = Awaited<ReturnType<typeof createLogger>>;

const LOGGER_FIELDS = ['name', 'serial', 'site', 'timezone', 'expectedIntervalS', 'channels'] as const;
const CHANNEL_FIELDS: ChannelFieldName[] = ['key', 'label', 'unit', 'quantity', 'validMin', 'validMax', 'expectedIntervalS', 'seasonalPeriodHint'];

/** Every field name a server message may point at, `channels.2.key` included. */
function serverFields(channelCount: number): string[] {
  const perChannel = Array.from({ length: channelCount }, (_, i) => CHANNEL_FIELDS.map((f) => `channels.${i}.${f}`));
  return [...LOGGER_FIELDS, ...perChannel.flat()];
}

/**
 * "Register a logger": name, serial, site, time zone (the browser's by default), expected
 * interval and a list of channels to which rows can be added and removed. Validated by the
 * server's own `createLoggerSchema`; the server's refusals land on the field they name.
 */
export function LoggerRegisterForm({ slug, onRegistered }: { slug: string; onRegistered: (result: RegisteredLogger) => void }) {
  const create = useCreateLogger(slug);
  const form = useForm<RegisterLoggerForm, unknown, z.output<typeof createLoggerSchema>>({
    resolver: zodResolver(createLoggerSchema, numberMessages),
    defaultValues: { name: '', serial: '', site: '', timezone: browserTimeZone(), expectedIntervalS: 600, channels: [{ ...EMPTY_CHANNEL }] },
  });
  const channels = useFieldArray({ control: form.control, name: 'channels' });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit((values) =>
    create.mutateAsync(values).then(onRegistered, (error: unknown) =>
      applyServerError(error, serverFields(values.channels.length), (name, e) => form.setError(name as FieldPath<RegisterLoggerForm> | 'root.server', e), {
        logger_name_taken: 'name',
      }),
    ),
  );
  const channelsError = errors.channels?.root?.message ?? errors.channels?.message;

  return (
    <form noValidate onSubmit={onSubmit} aria-label="Register a logger" className="grid gap-6">
      <fieldset className="grid gap-4 rounded-xl border border-rule bg-card p-5 sm:grid-cols-2">
        <legend className="px-1 text-lg font-semibold">The logger</legend>
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
        <TextField label="Serial number" autoComplete="off" hint="Optional." error={errors.serial?.message} {...form.register('serial')} />
        <TextField label="Site" autoComplete="off" hint="Optional, e.g. the plot or room." error={errors.site?.message} {...form.register('site')} />
        <TimeZoneSelect
          label="Time zone"
          hint="Where the logger stands; used for its local times."
          error={errors.timezone?.message}
          current={browserTimeZone()}
          {...form.register('timezone')}
        />
        <TextField
          label={`${LOGGER_LABELS.expectedIntervalS}${IN_SECONDS}`}
          inputMode="numeric"
          hint="Seconds between readings; a longer silence counts as a gap."
          error={errors.expectedIntervalS?.message}
          {...form.register('expectedIntervalS', { setValueAs: requiredNumber })}
        />
      </fieldset>

      <fieldset className="grid gap-4 rounded-xl border border-rule bg-card p-5">
        <legend className="px-1 text-lg font-semibold">Channels</legend>
        {channels.fields.length === 0 && <p className="text-sm text-ink-soft">No channels yet: readings need a channel to land in.</p>}
        <ol className="grid gap-5">
          {channels.fields.map((field, index) => (
            <li key={field.id} className="grid gap-3 border-b border-rule pb-5 last:border-b-0 last:pb-0">
              <div className="flex items-center justify-between gap-3">
                <h4 className="font-medium">Channel {index + 1}</h4>
                <Button size="sm" tone="quiet" onClick={() => channels.remove(index)} aria-label={`Remove channel ${index + 1}`}>
                  Remove
                </Button>
              </div>
              <ChannelFields
                position={index + 1}
                register={(name, options) => form.register(`channels.${index}.${name}`, options)}
                errors={errors.channels?.[index]}
              />
            </li>
          ))}
        </ol>
        {channelsError && <p className="text-sm text-alert">{channelsError}</p>}
        <div>
          <Button size="sm" onClick={() => channels.append({ ...EMPTY_CHANNEL })}>
            + Add a channel
          </Button>
        </div>
      </fieldset>

      {errors.root?.server && <Notice tone="alert">{errors.root.server.message}</Notice>}
      <div>
        <Button type="submit" tone="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Registering…' : 'Register logger'}
        </Button>
      </div>
    </form>
  );
}
