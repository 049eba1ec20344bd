/**
 * The people of the demo scenario. They live here, beside the demo lab they belong to, so that
 * both the server's `seed-demo` command and the identity provider stand-in
 * (`docker-free-scripts/identity-provider/`) can import them without either importing the other's folder.
 */

/** One person who can sign in at the local identity provider stand-in (development only). */
export interface DevAccount {
  /** Stable subject identifier the provider puts in `sub`. */
  sub: string;
  email: string;
  name: string;
  /** Plain text on purpose: these accounts exist only on a developer's machine and are printed by `npm start`. */
  password: string;
  /** The role this account plays in the demo lab, for the README: 'admin' | 'technician' | 'scientist' | 'guest' | 'none'. */
  role: string;
}

/**
 * The people of the fictional demo lab "Fernhollow Field Station" plus one outside collaborator
 * and one newcomer without a lab, so every role can be tried by signing in as someone.
 */
export const DEV_ACCOUNTS: DevAccount[] = [
  {
    sub: 'fernhollow-odalys-brennick',
    email: 'odalys.brennick@fernhollow.example',
    name: 'Odalys Brennick',
    password: 'fernhollow-admin',
    role: 'admin',
  },
  {
    sub: 'fernhollow-tobiah-quarrie',
    email: 'tobiah.quarrie@fernhollow.example',
    name: 'Tobiah Quarrie',
    password: 'fernhollow-technician',
    role: 'technician',
  },
  {
    sub: 'fernhollow-maren-olowe',
    email: 'maren.olowe@fernhollow.example',
    name: 'Maren Olowe',
    password: 'fernhollow-scientist',
    role: 'scientist',
  },
  {
    sub: 'tarnbeck-ilse-varga-moss',
    email: 'ilse.varga-moss@tarnbeck-institute.example',
    name: 'Ilse Varga-Moss',
    password: 'tarnbeck-guest',
    role: 'guest',
  },
  {
    sub: 'saltmarsh-rowan-achterberg',
    email: 'rowan.achterberg@saltmarsh-survey.example',
    name: 'Rowan Achterberg',
    password: 'saltmarsh-newcomer',
    role: 'none',
  },
];
