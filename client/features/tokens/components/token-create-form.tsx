import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { createPersonalTokenSchema, type IssuedToken } from '@shared/contract/tokens.ts';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { applyServerError } from '../../../components/server-field-error.ts';
import { useCreateToken } from '../api/create-token.ts';

type TokenForm = z.input<typeof createPersonalTokenSchema>;

/**
 * "New token": a name (what the token is for) and how many days it lives, checked with the
 * server's own schema; refusals appear on the field they name. `onCreated` gets the token,
 * which the page then shows this once.
 */
export function TokenCreateForm({ slug, onCreated }: { slug: string; onCreated: (issued: IssuedToken) => void }) {
  const create = useCreateToken(slug);
  const form = useForm<TokenForm, unknown, z.output<typeof createPersonalTokenSchema>>({
    resolver: zodResolver(createPersonalTokenSchema),
    defaultValues: { name: '', expiresInDays: 90 },
  });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit((values) =>
    create.mutateAsync(values).then(
      (issued) => {
        form.reset({ name: '', expiresInDays: values.expiresInDays });
        onCreated(issued);
      },
      (error: unknown) => applyServerError(error, ['name', 'expiresInDays'] as const, form.setError),
    ),
  );

  return (
    <form noValidate aria-label="New personal token" onSubmit={onSubmit} className="grid max-w-2xl gap-4 sm:grid-cols-[1fr_10rem_auto] sm:items-start">
      <TextField label="What is it for?" placeholder="e.g. soil notebook" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="Expires after (days)"
        type="number"
        inputMode="numeric"
        min={1}
        max={365}
        error={errors.expiresInDays?.message}
        {...form.register('expiresInDays', { valueAsNumber: true })}
      />
      <div className="sm:pt-6">
        <Button type="submit" tone="primary" disabled={isSubmitting}>
          {isSubmitting ? 'Making…' : 'Make token'}
        </Button>
      </div>
      {errors.root?.server && (
        <Notice tone="alert" className="sm:col-span-3">
          {errors.root.server.message}
        </Notice>
      )}
    </form>
  );
}
