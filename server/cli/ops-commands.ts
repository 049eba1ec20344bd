import type { z } from 'zod';
import type { Db } from '../db/create-db.ts';
import { labsRepo } from '../db/labs.repo.ts';
import { createLabsService } from '../services/labs.service.ts';
import { createInvitationsService } from '../services/invitations.service.ts';
import { createLoggersService } from '../services/loggers.service.ts';
import { createLoggerSchema } from '../contract/loggers.ts';
import { createLabSchema } from '../contract/labs.ts';
import type { LabContext } from '../services/lab-context.ts';
import { AppError, ValidationError } from '../errors.ts';
import { inLab } from '../db/tenant-scope.ts';
import { membershipsRepo } from '../db/memberships.repo.ts';
import { usersRepo } from '../db/users.repo.ts';
import { can } from '../policies/permissions.ts';
import { createPersonalTokensService } from '../services/personal-tokens.service.ts';
import { createPersonalTokenSchema } from '../contract/tokens.ts';

/**
 * Checks an operator's options with a contract schema; a failure is the same 400 `invalid_input`
 * (`field: reason` lines) the API gives, so the CLI prints the message the form would show.
 */
function parseInput<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
  const result = schema.safeParse(input);
  if (!result.success) throw new ValidationError(result.error.issues.map((i) => `${i.path.join('.') || 'body'}: ${i.message}`).join('; '));
  return result.data;
}

/** What each operator command returns (printed as text, or as JSON with --json). */
export interface CommandResult {
  text: string;
  json: Record<string, unknown>;
}

const OPERATOR_MAILER = {
  send: async () => {
    throw new Error('operators hand invitation links on; nothing is mailed from the CLI');
  },
  verify: async () => false,
  close: () => undefined,
};

async function labContext(db: Db, slug: string): Promise<LabContext> {
  const lab = await labsRepo(db).findBySlug(slug);
  if (!lab) throw new AppError(404, 'not_found', `No lab with the address "${slug}".`);
  return { ...lab, role: 'admin' };
}

/**
 * `create-lab`: a lab with an admin. The admin joins at once if they have signed in before,
 * otherwise an invitation link is printed for the operator to send them.
 */
export async function createLabCommand(db: Db, publicUrl: string, opts: { name: string; slug?: string; adminEmail: string }): Promise<CommandResult> {
  const input = parseInput(createLabSchema, { name: opts.name, slug: opts.slug });
  const { lab, adminUserId } = await createLabsService({ db }).createForOperator({ ...input, adminEmail: opts.adminEmail });
  if (adminUserId !== null) {
    return {
      text: `Created lab "${lab.name}" at /labs/${lab.slug}; ${opts.adminEmail} is its admin.`,
      json: { lab: { slug: lab.slug, name: lab.name }, admin: opts.adminEmail, invitationLink: null },
    };
  }
  const invitations = createInvitationsService({ db, mailer: OPERATOR_MAILER, publicUrl });
  const { link } = await invitations.inviteAsOperator({ ...lab, role: 'admin' }, { email: opts.adminEmail.toLowerCase(), role: 'admin' });
  return {
    text: `Created lab "${lab.name}" at /labs/${lab.slug}.\n${opts.adminEmail} has not signed in yet; send them this admin invitation (valid 7 days, single use):\n  ${link}`,
    json: { lab: { slug: lab.slug, name: lab.name }, admin: opts.adminEmail, invitationLink: link },
  };
}

/** Parses `key[:label[:unit[:min:max]]]` into a channel definition. */
export function parseChannelSpec(spec: string): Record<string, unknown> {
  const [key, label, unit, min, max] = spec.split(':');
  const num = (s: string | undefined) => (s === undefined || s === '' ? undefined : Number(s));
  return { key, label: label || key, unit: unit ?? '', validMin: num(min), validMax: num(max) };
}

/** `register-logger`: a logger with its channels; prints its ingest key (shown once). */
export async function registerLoggerCommand(
  db: Db,
  opts: { lab: string; name: string; intervalS: number; timezone: string; site?: string; serial?: string; channels: string[] },
): Promise<CommandResult> {
  const lab = await labContext(db, opts.lab);
  const input = parseInput(createLoggerSchema, {
    name: opts.name,
    site: opts.site,
    serial: opts.serial,
    timezone: opts.timezone,
    expectedIntervalS: opts.intervalS,
    channels: opts.channels.map(parseChannelSpec),
  });
  const { logger, issued } = await createLoggersService({ db }).register(lab, null, input);
  return {
    text: [
      `Registered logger "${logger.name}" (id ${logger.id}) in ${lab.slug} with channels: ${logger.channels.map((c) => c.key).join(', ') || '(none)'}.`,
      'Ingest key (shown once; store it on the logger now):',
      `  ${issued.key}`,
    ].join('\n'),
    json: { loggerId: logger.id, channels: logger.channels.map((c) => ({ id: c.id, key: c.key })), ingestKey: issued.key },
  };
}

/**
 * `mint-token`: a personal API token for a member of a lab (scientist and above), for a
 * notebook or script on their behalf. Printed once; only its hash is stored.
 */
export async function mintTokenCommand(db: Db, opts: { lab: string; email: string; name: string; days: number }): Promise<CommandResult> {
  const lab = await labContext(db, opts.lab);
  const input = parseInput(createPersonalTokenSchema, { name: opts.name, expiresInDays: opts.days });
  const email = opts.email.trim().toLowerCase();
  const member = (await membershipsRepo(inLab(db, lab.id)).list()).find((m) => m.email.toLowerCase() === email);
  if (!member) throw new AppError(404, 'not_found', `${opts.email} is not a member of ${lab.slug}.`);
  if (!can(member.role, 'tokens.manage-own'))
    throw new AppError(403, 'forbidden', `${opts.email} is a ${member.role} in ${lab.slug}; personal tokens are for scientists and above.`);
  const user = (await usersRepo(db).findById(member.userId))!;
  const actor = { id: user.id, email: user.email, emailVerified: user.emailVerified, displayName: user.displayName };
  const issued = await createPersonalTokensService({ db }).create({ ...lab, role: member.role }, actor, input);
  const expiresAt = issued.info.expiresAt.toISOString();
  return {
    text: [
      `Personal token "${issued.info.name}" for ${user.email} in ${lab.slug} (reads only; expires ${expiresAt}).`,
      'Token (shown once; hand it to its owner now):',
      `  ${issued.token}`,
    ].join('\n'),
    json: { token: issued.token, tokenId: issued.info.id, prefix: issued.info.prefix, lab: lab.slug, email: user.email, expiresAt },
  };
}
