import { useMutation } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { CreatedLab, CreateLabInput } from '@shared/contract/labs.ts';

/** `POST /api/v1/labs`: creates a lab with the signed-in person as its first admin. */
export function createLab(input: CreateLabInput): Promise<CreatedLab> {
  return apiFetch<CreatedLab>('/api/v1/labs', { method: 'POST', body: JSON.stringify(input) });
}

/** Creates a lab; a 403 `lab_limit_reached` ApiError says how many labs the account may create. */
export function useCreateLab() {
  return useMutation({ mutationFn: createLab });
}
