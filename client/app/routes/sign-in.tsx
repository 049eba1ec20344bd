import { useSearchParams } from 'react-router-dom';
import { SignInPanel } from '../../features/auth/components/sign-in-panel.tsx';

/** `/sign-in`: reads the failure code and the page to return to from the URL. */
export default function SignInRoute() {
  const [params] = useSearchParams();
  return <SignInPanel errorCode={params.get('error')} returnTo={params.get('returnTo')} signedOut={params.get('signedOut') === '1'} />;
}
