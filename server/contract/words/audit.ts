/**
 * Words of the audit log: the labels of its filters and the sentence each recorded action is
 * shown with. Placeholder until the sentences land (see auditSentence).
 */

/** Fields of the audit log's filters. */
export const AUDIT_LABELS = {
  action: 'What happened',
  actor: 'Done by',
  from: 'From',
  to: 'To',
  page: 'Page',
  pageSize: 'Entries per page',
} as const;
