import { useNavigate } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { meQueryOptions } from '../../features/auth/api/get-me.ts';
import { CreateLabForm } from '../../features/labs/components/create-lab-form.tsx';
import { paths } from '../paths.ts';

/** `/labs/new`: create a lab, then open it (the switcher learns about it from a fresh `/me`). */
export default function CreateLabRoute() {
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  return (
    <section className="max-w-2xl">
      <h1 className="text-2xl font-semibold">Create a lab</h1>
      <p className="mt-1 mb-6 text-ink-soft">You become its first admin and can invite your colleagues next.</p>
      <CreateLabForm
        onCreated={async (lab) => {
          await queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey });
          navigate(paths.lab.href(lab.slug));
        }}
      />
    </section>
  );
}
