/**
 * Words of the labs area (creating a lab, its settings, deleting it): field labels and the
 * reasons its checks give. Shared by the contract, the labs service and the client.
 */

/** Fields of a lab (`POST /api/v1/labs`, `PATCH …/labs/:lab`, deleting a lab). */
export const LAB_LABELS = {
  name: 'Lab name',
  slug: 'Web address',
  description: 'Description',
  confirmName: "The lab's name, to confirm",
} as const;

/** Reasons the labs area's own checks give. */
export const LAB_REASONS = {
  slugForm: 'use lowercase letters, digits and single hyphens',
  plainText: 'must be plain text (no control characters)',
  nameOrDescription: 'give a new name or a new description',
  confirmName: "type the lab's name to confirm",
  confirmNameMismatch: "does not match the lab's name",
} as const;
