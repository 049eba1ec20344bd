/**
 * Endpoint paths of the local identity provider stand-in, relative to its issuer. They are
 * oidc-provider's defaults, set explicitly so the app's relying-party configuration can reuse
 * them without discovery. `interaction` is the stand-in's own login and consent pages.
 */
export const IDENTITY_PROVIDER_PATHS = {
  authorization: '/auth',
  token: '/token',
  userinfo: '/me',
  jwks: '/jwks',
  endSession: '/session/end',
  interaction: '/interaction',
} as const;
