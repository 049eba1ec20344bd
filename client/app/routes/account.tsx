import { useMe } from '../../features/auth/api/get-me.ts';
import { AccountSettings } from '../../features/account/components/account-settings.tsx';

/** `/account`: the signed-in person's own settings (the signed-in layout has loaded `/me`). */
export default function AccountRoute() {
  const me = useMe();
  return (
    <section>
      <h1 className="mb-6 text-2xl font-semibold">Your account</h1>
      {me.data && <AccountSettings me={me.data} />}
    </section>
  );
}
