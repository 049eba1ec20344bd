import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { paths } from './paths.ts';

/** Routes load lazily so the entry chunk stays small. */
const router = createBrowserRouter([
  { path: paths.signIn.path, lazy: async () => ({ Component: (await import('./routes/sign-in.tsx')).default }) },
  {
    lazy: async () => ({ Component: (await import('./routes/signed-in-layout.tsx')).default }),
    children: [{ index: true, lazy: async () => ({ Component: (await import('./routes/home.tsx')).default }) }],
  },
  { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found.tsx')).default }) },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
