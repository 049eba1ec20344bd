import { inLab, type DbOrTrx } from '../../db/tenant-scope.ts';
import { membershipsRepo } from '../../db/memberships.repo.ts';
import type { Mailer, OutgoingMail } from '../../integrations/mail/create-mailer.ts';

/** Sends one mail to each admin of the lab (built per address by `build`); returns how many were sent. */
export async function mailLabAdmins(db: DbOrTrx, mailer: Mailer, labId: number, build: (to: string) => OutgoingMail): Promise<number> {
  const admins = (await membershipsRepo(inLab(db, labId)).list()).filter((m) => m.role === 'admin');
  for (const admin of admins) await mailer.send(build(admin.email));
  return admins.length;
}
