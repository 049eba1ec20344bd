import type { CreatePersonalTokenInput, IssuedToken } from '@shared/contract/tokens.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { tokensRootKey } from './get-tokens.ts';

/** `POST /api/v1/labs/:lab/tokens`: makes a personal token for the read routes. */
export function createToken(slug: string, input: CreatePersonalTokenInput): Promise<IssuedToken> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/tokens`, { method: 'POST', body: JSON.stringify(input) });
}

/** Makes a token, then refreshes the lab's token list. */
export function useCreateToken(slug: string) {
  return useRefreshingMutation(tokensRootKey(slug), (input: CreatePersonalTokenInput) => createToken(slug, input));
}
