import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { inviteMemberSchema } from '@shared/contract/invitations.ts';
import { ROLES, ROLE_LABELS } from '@shared/policies/permissions.ts';
import { Button } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { applyServerError } from '../../../components/server-field-error.ts';
import { useCreateInvitation } from '../api/create-invitation.ts';
import { invitationSent } from '../messages.ts';

type InviteForm = z.input<typeof inviteMemberSchema>;

/**
 * The admin's invite form, validated by the server's own `inviteMemberSchema`. A refusal
 * from the server (already pending, already a member) is shown on the e-mail field; a
 * sent invitation is confirmed and the form cleared for the next one.
 */
export function InviteForm({ slug }: { slug: string }) {
  const invite = useCreateInvitation(slug);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm<InviteForm, unknown, z.output<typeof inviteMemberSchema>>({
    resolver: zodResolver(inviteMemberSchema),
    defaultValues: { email: '', role: 'scientist' },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit((values) => {
    setSentTo(null);
    return invite.mutateAsync(values).then(
      () => {
        setSentTo(values.email);
        form.reset({ email: '', role: values.role });
      },
      (error: unknown) =>
        applyServerError(error, ['email', 'role'] as const, form.setError, {
          already_member: 'email',
          invitation_pending: 'email',
        }),
    );
  });

  return (
    <form noValidate onSubmit={onSubmit} aria-label="Invite someone" className="grid gap-4 sm:grid-cols-[2fr_1fr_auto] sm:items-start">
      <TextField label="E-mail address" type="email" autoComplete="off" error={errors.email?.message} {...form.register('email')} />
      <SelectField label="Role" error={errors.role?.message} {...form.register('role')}>
        {ROLES.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABELS[role]}
          </option>
        ))}
      </SelectField>
      <Button type="submit" tone="primary" disabled={isSubmitting} className="sm:mt-6">
        {isSubmitting ? 'Sending…' : 'Send invitation'}
      </Button>
      {errors.root?.server && (
        <Notice tone="alert" className="sm:col-span-3">
          {errors.root.server.message}
        </Notice>
      )}
      {sentTo && (
        <Notice tone="status" className="sm:col-span-3">
          {invitationSent(sentTo)}
        </Notice>
      )}
    </form>
  );
}
