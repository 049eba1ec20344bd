import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { loggerPatchSchema, type LoggerDetail } from '@shared/contract/loggers.ts';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { numberMessages, requiredNumber } from '../../../components/form-numbers.ts';
import { Notice } from '../../../components/notice.tsx';
import { applyServerError } from '../../../components/server-field-error.ts';
import { TimeZoneSelect } from '../../../components/time-zone-select.tsx';
import { useUpdateLogger } from '../api/update-logger.ts';
import { LOGGER_LABELS } from '@shared/contract/words/loggers.ts';
import { IN_SECONDS } from '../messages.ts';

type LoggerEditForm = z.input<typeof loggerPatchSchema>;
const FIELDS = ['name', 'serial', 'site', 'timezone', 'expectedIntervalS'] as const;

/** Edits a logger's name, serial, site, time zone and expected interval (the server's `loggerPatchSchema`). */
export function LoggerEditForm({ slug, logger, onDone }: { slug: string; logger: LoggerDetail; onDone: () => void }) {
  const update = useUpdateLogger(slug, logger.id);
  const form = useForm<LoggerEditForm, unknown, z.output<typeof loggerPatchSchema>>({
    resolver: zodResolver(loggerPatchSchema, numberMessages),
    defaultValues: {
      name: logger.name,
      serial: logger.serial ?? '',
      site: logger.site ?? '',
      timezone: logger.timezone,
      expectedIntervalS: logger.expectedIntervalS,
    },
  });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    update.mutateAsync(values).then(onDone, (error: unknown) => applyServerError(error, FIELDS, form.setError, { logger_name_taken: 'name' })),
  );
  return (
    <form noValidate onSubmit={onSubmit} aria-label="Edit the logger" className="grid gap-4 rounded-xl border border-rule bg-card p-5 sm:grid-cols-2">
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
      <TextField label="Serial number" autoComplete="off" error={errors.serial?.message} {...form.register('serial')} />
      <TextField label="Site" autoComplete="off" error={errors.site?.message} {...form.register('site')} />
      <TimeZoneSelect label="Time zone" current={logger.timezone} error={errors.timezone?.message} {...form.register('timezone')} />
      <TextField
        label={`${LOGGER_LABELS.expectedIntervalS}${IN_SECONDS}`}
        inputMode="numeric"
        error={errors.expectedIntervalS?.message}
        {...form.register('expectedIntervalS', { setValueAs: requiredNumber })}
      />
      {errors.root?.server && (
        <Notice tone="alert" className="sm:col-span-2">
          {errors.root.server.message}
        </Notice>
      )}
      <div className="flex gap-2 sm:col-span-2">
        <Button type="submit" tone="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : 'Save details'}
        </Button>
        <Button tone="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
