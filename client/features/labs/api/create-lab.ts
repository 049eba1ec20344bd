import { useMutation } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { CreateLabInput } from '../../../../server/http/labs/labs.schema.ts';
import type { Role } from '../../../../server/policies/permissions.ts';

export interface CreatedLab {
  lab: { slug: string; name: string; role: Role };
}

/** `POST /api/v1/labs`: creates a lab with the signed-in person as its first admin. */
export function createLab(input: CreateLabInput): Promise<CreatedLab> {
  return apiFetch<CreatedLab>('/api/v1/labs', { method: 'POST', body: JSON.stringify(input) });
}

/** Creates a lab; a 409 `slug_taken` ApiError names the slug field. */
export function useCreateLab() {
  return useMutation({ mutationFn: createLab });
}
