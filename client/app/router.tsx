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
      { path: paths.account.path, lazy: async () => ({ Component: (await import('./routes/account.tsx')).default }) },
      {
        path: paths.lab.path,
        lazy: async () => ({ Component: (await import('./routes/lab-layout.tsx')).default }),
        children: [
          { index: true, lazy: async () => ({ Component: (await import('./routes/lab-home.tsx')).default }) },
          { path: paths.labMembers.path, lazy: async () => ({ Component: (await import('./routes/lab-members.tsx')).default }) },
          { path: paths.labAudit.path, lazy: async () => ({ Component: (await import('./routes/lab-audit.tsx')).default }) },
          { path: paths.labLoggers.path, lazy: async () => ({ Component: (await import('./routes/lab-loggers.tsx')).default }) },
          { path: paths.labLoggerNew.path, lazy: async () => ({ Component: (await import('./routes/lab-logger-new.tsx')).default }) },
          { path: paths.labLogger.path, lazy: async () => ({ Component: (await import('./routes/lab-logger.tsx')).default }) },
          { path: paths.labLoggerUpload.path, lazy: async () => ({ Component: (await import('./routes/lab-logger-upload.tsx')).default }) },
          { path: paths.labChannels.path, lazy: async () => ({ Component: (await import('./routes/lab-channels.tsx')).default }) },
          { path: paths.labChannelsTogether.path, lazy: async () => ({ Component: (await import('./routes/lab-channels-together.tsx')).default }) },
          { path: paths.labChannel.path, lazy: async () => ({ Component: (await import('./routes/lab-channel.tsx')).default }) },
          { path: paths.labAlerts.path, lazy: async () => ({ Component: (await import('./routes/lab-alerts.tsx')).default }) },
          { path: paths.labNotes.path, lazy: async () => ({ Component: (await import('./routes/lab-notes.tsx')).default }) },
          { path: paths.labQuarantine.path, lazy: async () => ({ Component: (await import('./routes/lab-quarantine.tsx')).default }) },
          { path: paths.labTokens.path, lazy: async () => ({ Component: (await import('./routes/lab-tokens.tsx')).default }) },
          { path: paths.labBilling.path, lazy: async () => ({ Component: (await import('./routes/lab-billing.tsx')).default }) },
          { path: paths.labSettings.path, lazy: async () => ({ Component: (await import('./routes/lab-settings.tsx')).default }) },
        ],
      },
      { path: paths.apiReference.path, lazy: async () => ({ Component: (await import('./routes/api-reference.tsx')).default }) },
      { path: paths.joinLab.path, lazy: async () => ({ Component: (await import('./routes/join-lab.tsx')).default }) },
    ],
  },
  { path: '*', lazy: async () => ({ Component: (await import('./routes/not-found.tsx')).default }) },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
