import { useId } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { LAB_DESCRIPTION_MAX, updateLabSchema, type LabDetail } from '@shared/contract/labs.ts';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { applyServerError } from '../../../components/server-field-error.ts';
import { useUpdateLab } from '../api/update-lab.ts';

type LabSettingsFields = z.input<typeof updateLabSchema>;

/**
 * The lab's name and description (admins). The address is shown but not editable: it stays
 * when the lab is renamed, so links and bookmarks keep working. The form checks with the
 * server's own schema; server refusals land on the field they name.
 */
export function LabSettingsForm({ lab }: { lab: LabDetail['lab'] }) {
  const update = useUpdateLab(lab.slug);
  const descriptionId = useId();
  const form = useForm<LabSettingsFields, unknown, z.output<typeof updateLabSchema>>({
    resolver: zodResolver(updateLabSchema),
    values: { name: lab.name, description: lab.description },
  });
  const { errors, isSubmitting, isDirty } = form.formState;
  const description = form.watch('description') ?? '';

  const onSubmit = form.handleSubmit((values) =>
    update.mutateAsync(values).then(
      () => undefined,
      (error: unknown) => applyServerError(error, ['name', 'description'] as const, form.setError),
    ),
  );

  return (
    <form noValidate onSubmit={onSubmit} className="grid max-w-xl gap-5" aria-label="Name and description">
      <TextField label="Lab name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
      <div>
        <label htmlFor={descriptionId} className="block text-sm font-medium">
          Description
        </label>
        <textarea
          id={descriptionId}
          rows={4}
          aria-invalid={errors.description ? true : undefined}
          aria-describedby={`${descriptionId}-hint${errors.description ? ` ${descriptionId}-error` : ''}`}
          className="mt-1 block w-full rounded-lg border border-rule bg-card px-3 py-2 text-ink aria-[invalid=true]:border-alert"
          {...form.register('description')}
        />
        <p id={`${descriptionId}-hint`} className="mt-1 text-xs text-ink-soft">
          Plain text: what the lab measures and where, who to ask. {description.length.toLocaleString('en')} of {LAB_DESCRIPTION_MAX.toLocaleString('en')}{' '}
          characters.
        </p>
        {errors.description && (
          <p id={`${descriptionId}-error`} className="mt-1 text-sm text-alert">
            {errors.description.message}
          </p>
        )}
      </div>
      <p className="text-sm text-ink-soft">
        The lab’s address stays <span className="font-mono">/labs/{lab.slug}</span> when you rename it, so links and bookmarks keep working.
      </p>
      {errors.root?.server && <Notice tone="alert">{errors.root.server.message}</Notice>}
      {update.isSuccess && !isDirty && <Notice tone="status">Saved.</Notice>}
      <div>
        <Button type="submit" tone="primary" disabled={isSubmitting || !isDirty}>
          {isSubmitting ? 'Saving…' : 'Save name and description'}
        </Button>
      </div>
    </form>
  );
}
