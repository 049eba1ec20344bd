import { createBrowserRouter, RouterProvider } from 'react-router-dom';
import { paths } from './paths.ts';

/** Routes load lazily so the entry chunk stays small. */
const router = createBrowserRouter([
  { path: paths.signIn.path, lazy: async () => ({ Component: (await import('./routes/sign-in.tsx')).default }) },
  {
    lazy: async () => ({ Component: (await import('./routes/signed-in-layout.tsx')).default }),
    children: [
      { index: true, lazy: async () => ({ Component: (await import('./routes/home.tsx')).default }) },
      { path: paths.createLab.path, lazy: async () => ({ Component: (await import('./routes/create-lab.tsx')).default }) },
      {
        path: paths.lab.path,
        lazy: async () => ({ Component: (await import('./routes/lab-layout.tsx')).default }),
        children: [
          { index: true, lazy: async () => ({ Component: (await import('./routes/lab-home.tsx')).default }) },
          { path: paths.labMembers.path, lazy: async () => ({ Component: (await import('./routes/lab-members.tsx')).default }) },
          { path: paths.labAudit.path, lazy: async () => ({ Component: (await import('./routes/lab-audit.tsx')).default }) },
        ],
      },
      { path: paths.joinLab.path, lazy: async () => ({ Component: (await import('./routes/join-lab.tsx')).default }) },
    ],
  },
  { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found.tsx')).default }) },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
