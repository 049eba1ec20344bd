import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { tokensRootKey } from './get-tokens.ts';

/** `DELETE /api/v1/labs/:lab/tokens/:tokenId`: the token stops working at once. */
export function revokeToken(slug: string, tokenId: number): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/tokens/${tokenId}`, { method: 'DELETE' });
}

/** Revokes one of the member's tokens, then refreshes the lab's token list. */
export function useRevokeToken(slug: string, tokenId: number) {
  return useRefreshingMutation(tokensRootKey(slug), () => revokeToken(slug, tokenId));
}
