import { ConfirmAction } from '../../../components/confirm-action.tsx';
import { useRetireLogger } from '../api/retire-logger.ts';
import { retireLoggerQuestion } from '../messages.ts';

/** "Retire logger", asked first: its readings are kept, its keys stop working and it leaves the list. */
export function RetireLoggerButton({ slug, loggerId, name }: { slug: string; loggerId: number; name: string }) {
  const retire = useRetireLogger(slug, loggerId);
  return (
    <ConfirmAction
      label="Retire logger"
      size="md"
      question={retireLoggerQuestion(name)}
      confirmLabel={`Retire ${name}`}
      pending={retire.isPending}
      onConfirm={() => retire.mutate()}
      error={retire.error}
    />
  );
}
