// The audit words moved to the feature's catalogue (client/features/audit/messages.ts); kept so imports stay valid.
export { AUDIT_ACTION_LABELS, auditActionLabel, OTHER_ACTION } from '../messages.ts';
