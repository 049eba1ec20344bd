import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { createLabSchema, slugFromName } from '@shared/contract/labs.ts';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { applyServerError } from '../../../components/server-field-error.ts';
import type { CreatedLab } from '@shared/contract/labs.ts';
import { useCreateLab } from '../api/create-lab.ts';

type CreateLabForm = z.input<typeof createLabSchema>;

/**
 * The "create a lab" form. The address (slug) follows the name as it is typed, via the
 * same `slugFromName` the server uses, until the person edits the address themselves;
 * an emptied address is left for the server to derive. When the address asked for was not
 * available the server gives the lab a variant (e.g. "…-2"): the form then says which address
 * the lab got before opening it. Server refusals (the account's lab limit) appear on the form.
 */
export function CreateLabForm({ onCreated }: { onCreated: (lab: CreatedLab['lab']) => void }) {
  const createLab = useCreateLab();
  const [slugEdited, setSlugEdited] = useState(false);
  const [varied, setVaried] = useState<CreatedLab | null>(null);
  const form = useForm<CreateLabForm, unknown, z.output<typeof createLabSchema>>({
    resolver: zodResolver(createLabSchema),
    defaultValues: { name: '', slug: '' },
  });
  const { errors, isSubmitting } = form.formState;
  const slug = form.watch('slug');
  const name = form.watch('name');
  const address = slug || slugFromName(name ?? '');

  const onSubmit = form.handleSubmit((values) =>
    createLab.mutateAsync(values).then(
      (created) => (created.lab.slug === created.requestedSlug ? onCreated(created.lab) : setVaried(created)),
      (error: unknown) => applyServerError(error, ['name', 'slug'] as const, form.setError),
    ),
  );

  if (varied) {
    return (
      <div className="grid max-w-xl gap-5">
        <Notice tone="status">
          <strong>{varied.lab.name}</strong> is ready. Its address is <span className="font-mono">/labs/{varied.lab.slug}</span>:{' '}
          <span className="font-mono">/labs/{varied.requestedSlug}</span> was not available.
        </Notice>
        <div>
          <Button tone="primary" onClick={() => onCreated(varied.lab)}>
            Open the lab
          </Button>
        </div>
      </div>
    );
  }

  return (
    <form noValidate onSubmit={onSubmit} className="grid max-w-xl gap-5">
      <TextField
        label="Lab name"
        autoComplete="off"
        error={errors.name?.message}
        {...form.register('name', {
          onChange: (e: { target: { value: string } }) => {
            if (!slugEdited) form.setValue('slug', slugFromName(e.target.value));
          },
        })}
      />
      <TextField
        label="Address"
        autoComplete="off"
        spellCheck={false}
        className="font-mono"
        error={errors.slug?.message}
        hint={
          <>
            Your lab will live at <span className="font-mono">/labs/{address || '…'}</span>. Lowercase letters, digits and hyphens.
          </>
        }
        {...form.register('slug', {
          setValueAs: (v: string | undefined) => (v && v.trim() !== '' ? v.trim() : undefined),
          onChange: (e: { target: { value: string } }) => setSlugEdited(e.target.value.trim() !== ''),
        })}
      />
      {errors.root?.server && <Notice tone="alert">{errors.root.server.message}</Notice>}
      <div>
        <Button type="submit" tone="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Creating…' : 'Create lab'}
        </Button>
      </div>
    </form>
  );
}
