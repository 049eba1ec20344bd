import { useMutation } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { CreateLabInput } from '../../../../server/http/labs/labs.schema.ts';
import type { Role } from '../../../../server/policies/permissions.ts';

export interface CreatedLab {
  lab: { slug: string; name: string; role: Role };
  /** The address asked for; `lab.slug` differs when that one was unavailable and the lab got a variant. */
  requestedSlug: string;
}

/** `POST /api/v1/labs`: creates a lab with the signed-in person as its first admin. */
export function createLab(input: CreateLabInput): Promise<CreatedLab> {
  return apiFetch<CreatedLab>('/api/v1/labs', { method: 'POST', body: JSON.stringify(input) });
}

/** Creates a lab; a 403 `lab_limit_reached` ApiError says how many labs the account may create. */
export function useCreateLab() {
  return useMutation({ mutationFn: createLab });
}
