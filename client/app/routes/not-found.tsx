import { Link } from 'react-router-dom';
import { paths } from '../paths.ts';

/** Any client path that matches no route. */
export default function NotFoundRoute() {
  return (
    <div className="p-10">
      <h1 className="text-2xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-ink-soft">This page does not exist, or you do not have access to it.</p>
      <Link className="mt-4 inline-block text-lichen underline" to={paths.home.href()}>
        Back to Lagbook
      </Link>
    </div>
  );
}
