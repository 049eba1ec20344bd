import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { ConfigError } from '../../errors.ts';

const limitsSchema = z.object({
  /** Readings the lab may keep stored. */
  readings: z.number().int().positive(),
  /** Loggers registered and not retired. */
  loggers: z.number().int().positive(),
  /** Members plus pending invitations. */
  members: z.number().int().positive(),
  /** How many days back the lab may browse and analyse (older readings stay stored unless `readingRemoval` is enabled). */
  historyDays: z.number().int().positive(),
  /**
   * Rows the lab may keep in quarantine (rows that could not be stored, kept for review); a
   * batch that would pass it is refused whole until technicians discard or re-submit rows.
   */
  quarantinedRows: z.number().int().positive(),
});

/**
 * Whether the plan removes readings from storage once they are past its history, and when.
 * Reads are limited to `limits.historyDays` whatever this says; this decides whether the older
 * readings also leave the database (the retention job, server/services/retention/).
 * Until a plan says otherwise nothing is removed.
 */
const readingRemovalSchema = z.object({
  /**
   * True: readings older than `historyDays + exportDays` before now are removed for good (whole
   * UTC days, by the daily retention job). False: every reading stays stored, however old.
   */
  enabled: z.boolean(),
  /**
   * Days a reading stays stored after it has left the plan's history, so a lab (for example one
   * that has just moved to a shorter plan) can still export it before it goes. 0 to 3,650.
   */
  exportDays: z.number().int().min(0).max(3650),
});

/** The policy of a plan that does not name one: nothing is removed. */
export const KEEP_EVERY_READING = { enabled: false, exportDays: 30 } as const;

const planSchema = z.object({
  key: z.string().regex(/^[a-z][a-z0-9-]{1,39}$/, 'lower-case letters, digits and -, 2 to 40 characters'),
  name: z.string().min(1).max(40),
  summary: z.string().max(200).default(''),
  /** Price per month in the currency's smallest unit (cents); 0 for the free plan. */
  monthlyAmount: z.number().int().min(0),
  /** The Stripe price's lookup key; null for the free plan. */
  priceLookupKey: z
    .string()
    .regex(/^[A-Za-z0-9_-]{3,200}$/)
    .nullable(),
  limits: limitsSchema,
  /** Removal of readings past the history (see readingRemovalSchema); absent means keep everything. */
  readingRemoval: readingRemovalSchema.default(() => ({ ...KEEP_EVERY_READING })),
});

export const planCatalogSchema = z
  .object({
    currency: z.string().regex(/^[a-z]{3}$/, 'an ISO 4217 code in lower case'),
    plans: z.array(planSchema).min(2, 'needs the free plan and at least one paid plan'),
  })
  .superRefine((catalog, ctx) => {
    const free = catalog.plans.filter((p) => p.priceLookupKey === null);
    if (free.length !== 1)
      ctx.addIssue({ code: 'custom', path: ['plans'], message: `needs exactly one free plan (priceLookupKey null), found ${free.length}` });
    catalog.plans.forEach((p, i) => {
      if (p.priceLookupKey === null && p.monthlyAmount !== 0)
        ctx.addIssue({ code: 'custom', path: ['plans', i, 'monthlyAmount'], message: 'the free plan costs 0' });
      if (p.priceLookupKey !== null && p.monthlyAmount === 0)
        ctx.addIssue({ code: 'custom', path: ['plans', i, 'monthlyAmount'], message: 'a paid plan needs a price above 0' });
      if (catalog.plans.findIndex((q) => q.key === p.key) !== i)
        ctx.addIssue({ code: 'custom', path: ['plans', i, 'key'], message: `"${p.key}" is used twice` });
      if (p.priceLookupKey !== null && catalog.plans.findIndex((q) => q.priceLookupKey === p.priceLookupKey) !== i) {
        ctx.addIssue({ code: 'custom', path: ['plans', i, 'priceLookupKey'], message: `"${p.priceLookupKey}" is used twice` });
      }
    });
  });

export type Plan = z.infer<typeof planSchema>;
export type PlanLimits = Plan['limits'];
export type ReadingRemoval = Plan['readingRemoval'];
export type LimitName = 'readings' | 'loggers' | 'members' | 'quarantinedRows';

/** The validated plan catalog with the look-ups billing needs. */
export interface PlanCatalog {
  currency: string;
  plans: readonly Plan[];
  free: Plan;
  /** The plan with this key, or undefined. */
  byKey(key: string): Plan | undefined;
  /** The paid plan sold under this Stripe price lookup key, or undefined. */
  byLookupKey(lookupKey: string): Plan | undefined;
}

/**
 * Validates a parsed catalog document and returns it with its look-ups; throws ConfigError
 * with one `path: reason` per problem, so a bad catalog stops the server like bad settings do.
 */
export function parsePlanCatalog(document: unknown, source = 'plan catalog'): PlanCatalog {
  const parsed = planCatalogSchema.safeParse(document);
  if (!parsed.success) {
    const reasons = parsed.error.issues.map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`).join('; ');
    throw new ConfigError(`Invalid plan catalog ${source}: ${reasons}`);
  }
  const { currency, plans } = parsed.data;
  return {
    currency,
    plans,
    free: plans.find((p) => p.priceLookupKey === null)!,
    byKey: (key) => plans.find((p) => p.key === key),
    byLookupKey: (lookupKey) => plans.find((p) => p.priceLookupKey === lookupKey),
  };
}

/** Reads and validates the catalog file (`tenants/plans.json` unless LAGBOOK_PLANS_FILE says otherwise). */
export function loadPlanCatalog(path: string): PlanCatalog {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (err) {
    throw new ConfigError(`Invalid plan catalog ${path}: cannot read it (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
  }
  let document: unknown;
  try {
    document = JSON.parse(text);
  } catch (err) {
    throw new ConfigError(`Invalid plan catalog ${path}: not valid JSON (${(err as Error).message})`);
  }
  return parsePlanCatalog(document, path);
}
