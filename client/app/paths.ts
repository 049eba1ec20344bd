/** Every client route path in one place, so links and the router never disagree. */
export const paths = {
  home: { path: '/', href: () => '/' },
  signIn: {
    path: '/sign-in',
    href: (returnTo?: string) => (returnTo && returnTo !== '/' ? `/sign-in?returnTo=${encodeURIComponent(returnTo)}` : '/sign-in'),
  },
  createLab: { path: '/labs/new', href: () => '/labs/new' },
  account: { path: '/account', href: () => '/account' },
  lab: { path: '/labs/:lab', href: (slug: string) => `/labs/${encodeURIComponent(slug)}` },
  labMembers: { path: '/labs/:lab/members', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/members` },
  labAudit: {
    path: '/labs/:lab/audit',
    href: (slug: string, search = '') => `/labs/${encodeURIComponent(slug)}/audit${search && !search.startsWith('?') ? `?${search}` : search}`,
  },
  labLoggers: { path: '/labs/:lab/loggers', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/loggers` },
  labLoggerNew: { path: '/labs/:lab/loggers/new', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/loggers/new` },
  labLogger: {
    path: '/labs/:lab/loggers/:loggerId',
    href: (slug: string, loggerId: number) => `/labs/${encodeURIComponent(slug)}/loggers/${loggerId}`,
  },
  labLoggerUpload: {
    path: '/labs/:lab/loggers/:loggerId/upload',
    href: (slug: string, loggerId: number) => `/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/upload`,
  },
  labChannels: { path: '/labs/:lab/channels', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/channels` },
  // `search` from writeTogetherParams (client/features/channels/components/together-url.ts): channels, from, to, zone
  labChannelsTogether: {
    path: '/labs/:lab/channels/together',
    href: (slug: string, search = '') => `/labs/${encodeURIComponent(slug)}/channels/together${search && !search.startsWith('?') ? `?${search}` : search}`,
  },
  labChannel: {
    path: '/labs/:lab/channels/:channelId',
    href: (slug: string, channelId: number) => `/labs/${encodeURIComponent(slug)}/channels/${channelId}`,
  },
  labAlerts: { path: '/labs/:lab/alerts', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/alerts` },
  labNotes: { path: '/labs/:lab/notes', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/notes` },
  labQuarantine: {
    path: '/labs/:lab/quarantine',
    href: (slug: string, search = '') => `/labs/${encodeURIComponent(slug)}/quarantine${search && !search.startsWith('?') ? `?${search}` : search}`,
  },
  labTokens: { path: '/labs/:lab/tokens', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/tokens` },
  labBilling: { path: '/labs/:lab/billing', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/billing` },
  labSettings: { path: '/labs/:lab/settings', href: (slug: string) => `/labs/${encodeURIComponent(slug)}/settings` },
  // Not `/api`: the server answers everything below /api itself, so a reload there would miss the client.
  apiReference: { path: '/api-reference', href: () => '/api-reference' },
  joinLab: {
    path: '/join/:lab/:token',
    href: (slug: string, token: string) => `/join/${encodeURIComponent(slug)}/${encodeURIComponent(token)}`,
  },
} as const;

/** Where the server's OIDC flow starts; a full page navigation, not a client route. */
export function serverSignInUrl(returnTo: string | null, switchTo?: string): string {
  const q = new URLSearchParams();
  if (returnTo) q.set('returnTo', returnTo);
  if (switchTo) {
    // ask the identity provider for a fresh login (it may remember the previous person)
    q.set('switchAccount', '1');
    q.set('loginHint', switchTo);
  }
  const query = q.toString();
  return `/auth/sign-in${query ? `?${query}` : ''}`;
}
