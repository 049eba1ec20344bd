import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { AppShell } from '../../components/app-shell.tsx';
import { useMe } from '../../features/auth/api/get-me.ts';
import { useSignOut } from '../../features/auth/api/sign-out.ts';
import { isUnauthenticated } from '../../lib/api-client.ts';
import { paths } from '../paths.ts';

/** Wraps every page that needs a signed-in person; sends everyone else to sign-in and back. */
export default function SignedInLayout() {
  const me = useMe();
  const signOut = useSignOut();
  const location = useLocation();
  if (me.isPending) {
    return (
      <p className="p-8 text-ink-soft" role="status">
        Loading…
      </p>
    );
  }
  if (me.isError) {
    if (isUnauthenticated(me.error)) {
      return <Navigate to={paths.signIn.href(location.pathname + location.search)} replace />;
    }
    return (
      <p role="alert" className="p-8 text-alert">
        {me.error.message}
      </p>
    );
  }
  return (
    <AppShell userName={me.data.user.name} labs={me.data.labs} onSignOut={() => signOut.mutate()}>
      <Outlet context={me.data} />
    </AppShell>
  );
}
