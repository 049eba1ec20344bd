import { useForm, type UseFormRegisterReturn } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { channelInputSchema, channelPatchSchema, type Channel } from '@shared/contract/loggers.ts';
import { Button } from '../../../components/button.tsx';
import { numberMessages } from '../../../components/form-numbers.ts';
import { Notice } from '../../../components/notice.tsx';
import { applyServerError } from '../../../components/server-field-error.ts';
import { useAddChannel } from '../api/add-channel.ts';
import { useUpdateChannel } from '../api/update-channel.ts';
import { ChannelFields, EMPTY_CHANNEL, type ChannelFieldName, type ChannelFieldOptions } from './channel-fields.tsx';

type ChannelForm = z.input<typeof channelInputSchema>;
type ChannelPatchForm = z.input<typeof channelPatchSchema>;
const FIELDS: ChannelFieldName[] = ['key', 'label', 'unit', 'quantity', 'validMin', 'validMax', 'expectedIntervalS', 'seasonalPeriodHint'];

/** A stored channel as the form holds it (empty boxes for unset text). */
function valuesOf(channel: Channel): ChannelPatchForm {
  return {
    key: channel.key,
    label: channel.label,
    unit: channel.unit ?? '',
    quantity: channel.quantity ?? '',
    validMin: channel.validMin,
    validMax: channel.validMax,
    expectedIntervalS: channel.expectedIntervalS,
    seasonalPeriodHint: channel.seasonalPeriodHint,
  };
}

/** The form's frame: fields, the server's refusal, and Save / Cancel. */
function ChannelFormFrame({
  label,
  register,
  errors,
  rootError,
  submitting,
  submitLabel,
  keyHint,
  onSubmit,
  onCancel,
}: {
  label: string;
  register: (name: ChannelFieldName, options?: ChannelFieldOptions) => UseFormRegisterReturn;
  errors: Partial<Record<ChannelFieldName, { message?: string }>>;
  rootError?: string;
  submitting: boolean;
  submitLabel: string;
  keyHint?: string;
  onSubmit: () => void;
  onCancel: () => void;
}) {
  return (
    <form
      noValidate
      aria-label={label}
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit();
      }}
      className="grid gap-4 rounded-xl border border-rule bg-card p-5"
    >
      <h3 className="text-lg font-semibold">{label}</h3>
      <ChannelFields register={register} errors={errors} keyHint={keyHint} />
      {rootError && <Notice tone="alert">{rootError}</Notice>}
      <div className="flex gap-2">
        <Button type="submit" tone="primary" disabled={submitting}>
          {submitting ? 'Saving…' : submitLabel}
        </Button>
        <Button tone="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** Puts a refusal on the field it names: a taken key on Key, a reversed range on the maximum. */
const setServerError = (setError: (name: ChannelFieldName | 'root.server', e: { type: string; message: string }) => void) => (error: unknown) =>
  applyServerError(error, FIELDS, setError, { channel_key_taken: 'key', invalid_range: 'validMax' });

/** Adds a channel to a logger, validated by the server's `channelInputSchema`. */
export function AddChannelForm({ slug, loggerId, onDone }: { slug: string; loggerId: number; onDone: () => void }) {
  const add = useAddChannel(slug, loggerId);
  const form = useForm<ChannelForm, unknown, z.output<typeof channelInputSchema>>({
    resolver: zodResolver(channelInputSchema, numberMessages),
    defaultValues: { ...EMPTY_CHANNEL },
  });
  const submit = form.handleSubmit((values) => add.mutateAsync(values).then(onDone, setServerError(form.setError)));
  return (
    <ChannelFormFrame
      label="Add a channel"
      register={(name, options) => form.register(name, options)}
      errors={form.formState.errors}
      rootError={form.formState.errors.root?.server?.message}
      submitting={form.formState.isSubmitting}
      submitLabel="Add channel"
      onSubmit={() => void submit()}
      onCancel={onDone}
    />
  );
}

/** Edits a channel, validated by the server's `channelPatchSchema`. */
export function EditChannelForm({ slug, channel, onDone }: { slug: string; channel: Channel; onDone: () => void }) {
  const update = useUpdateChannel(slug, channel.loggerId, channel.id);
  const form = useForm<ChannelPatchForm, unknown, z.output<typeof channelPatchSchema>>({
    resolver: zodResolver(channelPatchSchema, numberMessages),
    defaultValues: valuesOf(channel),
  });
  const submit = form.handleSubmit((values) => update.mutateAsync(values).then(onDone, setServerError(form.setError)));
  return (
    <ChannelFormFrame
      label={`Edit channel ${channel.key}`}
      register={(name, options) => form.register(name, options)}
      errors={form.formState.errors}
      rootError={form.formState.errors.root?.server?.message}
      submitting={form.formState.isSubmitting}
      submitLabel="Save channel"
      keyHint="Renaming the key means the logger must send the new one."
      onSubmit={() => void submit()}
      onCancel={onDone}
    />
  );
}
