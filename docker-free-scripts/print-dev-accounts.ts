/** Prints the local identity provider's dev accounts (for `npm start`). */
import { DEV_ACCOUNTS } from '../tenants/demo/people.ts';

for (const a of DEV_ACCOUNTS) {
  process.stdout.write(`  ${a.role.padEnd(11)} ${a.email.padEnd(44)} password: ${a.password}\n`);
}
