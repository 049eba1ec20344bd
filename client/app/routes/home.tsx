import { useOutletContext } from 'react-router-dom';
import type { Me } from '../../features/auth/api/get-me.ts';

/** The signed-in landing page: a greeting and the person's labs. */
export default function HomeRoute() {
  const me = useOutletContext<Me>();
  return (
    <section>
      <h1 className="text-2xl font-semibold">Welcome, {me.user.name}</h1>
      <p className="mt-1 text-ink-soft">Signed in as {me.user.email}</p>
      <h2 className="mt-8 text-lg font-semibold">Your labs</h2>
      {me.labs.length === 0 ? (
        <p className="mt-2 text-ink-soft">You do not belong to a lab yet. Ask a lab admin for an invitation.</p>
      ) : (
        <ul className="mt-3 grid gap-3 sm:grid-cols-2">
          {me.labs.map((lab) => (
            <li key={lab.slug} className="rounded-xl border border-rule bg-card p-4">
              <p className="font-medium">{lab.name}</p>
              <p className="text-sm text-ink-soft">Your role: {lab.role}</p>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
