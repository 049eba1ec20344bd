import { ConfirmButton } from '../../../components/confirm-button.tsx';
import { useLeaveLab } from '../api/leave-lab.ts';
import { leaveLabQuestion } from '../messages.ts';

/** "Leave this lab" for any member, asked twice; the last admin is told why they cannot. */
export function LeaveLabButton({ slug, labName, onLeft }: { slug: string; labName: string; onLeft: () => void }) {
  const leave = useLeaveLab(slug);
  return (
    <div>
      <ConfirmButton
        label="Leave this lab"
        question={leaveLabQuestion(labName)}
        confirmLabel="Leave the lab"
        size="md"
        pending={leave.isPending}
        onConfirm={() => leave.mutate(undefined, { onSuccess: onLeft })}
      />
      {leave.isError && (
        <p role="alert" className="mt-2 text-sm text-alert">
          {leave.error.message}
        </p>
      )}
    </div>
  );
}
