import type { LabOwnedTable } from '../../db/tenant-scope.ts';

/**
 * The order in which a deleted lab's rows are removed: every table of LAB_OWNED_TABLES once
 * (a unit test checks the sets are equal, so a lab-owned table added later cannot be
 * forgotten), children before the rows they point to (channels and ingest keys before their
 * loggers: the only foreign keys between lab-owned tables, checked against the schema by the
 * deletion API test), the billing row early (a late Stripe webhook then finds no lab to
 * change), and the lab's own audit log last. The bulk — readings and rollups — goes first.
 */
export const DELETION_ORDER: readonly LabOwnedTable[] = [
  'lab_billing',
  'usage_snapshots',
  'readings',
  'reading_rollups',
  'test_readings',
  'quarantined_rows',
  'quarantine_bulk_runs',
  'notes',
  'note_kinds',
  'alerts',
  'alert_subscriptions',
  'alert_rules',
  'notification_outbox',
  'ingest_keys',
  'channels',
  'loggers',
  'personal_tokens',
  'invitations',
  'memberships',
  'audit_events',
];
