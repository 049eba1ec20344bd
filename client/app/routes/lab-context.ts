import { useCallback } from 'react';
import { useOutletContext } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { Me } from '@shared/contract/me.ts';
import { meQueryOptions } from '../../features/auth/api/get-me.ts';
import type { LabDetail } from '@shared/contract/labs.ts';
import { labQueryOptions } from '../../features/labs/api/get-lab.ts';

/** What the lab layout hands to the lab's pages. */
export interface LabOutletContext {
  me: Me;
  detail: LabDetail;
}

/** The signed-in person and the current lab, for a page inside the lab layout. */
export function useLabContext(): LabOutletContext {
  return useOutletContext<LabOutletContext>();
}

/**
 * Re-reads the signed-in person's labs and the lab's own record after a membership change,
 * since either may have changed the person's role (and so what the pages may show).
 */
export function useRefreshMembership(slug: string): () => void {
  const queryClient = useQueryClient();
  return useCallback(() => {
    void queryClient.invalidateQueries({ queryKey: labQueryOptions(slug).queryKey, exact: true });
    void queryClient.invalidateQueries({ queryKey: meQueryOptions().queryKey });
  }, [queryClient, slug]);
}
