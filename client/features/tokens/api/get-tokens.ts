import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PersonalTokensAnswer } from '@shared/contract/tokens.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** Every token query of a lab lives under this key, so one invalidation refreshes them all. */
export const tokensRootKey = (slug: string) => ['labs', slug, 'tokens'] as const;

/** `GET /api/v1/labs/:lab/tokens`: the signed-in member's own tokens in this lab. */
export function getTokens(slug: string): Promise<PersonalTokensAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/tokens`);
}

export const tokensQueryOptions = (slug: string) => queryOptions({ queryKey: [...tokensRootKey(slug), 'own'], queryFn: () => getTokens(slug) });

/** The member's own personal tokens in the lab. */
export function useTokens(slug: string) {
  return useQuery(tokensQueryOptions(slug));
}
