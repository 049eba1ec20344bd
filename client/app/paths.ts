/** Every client route path in one place, so links and the router never disagree. */
export const paths = {
  home: { path: '/', href: () => '/' },
  signIn: {
    path: '/sign-in',
    href: (returnTo?: string) => (returnTo && returnTo !== '/' ? `/sign-in?returnTo=${encodeURIComponent(returnTo)}` : '/sign-in'),
  },
} as const;

/** Where the server's OIDC flow starts; a full page navigation, not a client route. */
export function serverSignInUrl(returnTo: string | null): string {
  return `/auth/sign-in${returnTo ? `?returnTo=${encodeURIComponent(returnTo)}` : ''}`;
}
