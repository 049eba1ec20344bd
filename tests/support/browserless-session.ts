import { CookieJar } from 'tough-cookie';

/**
 * A tiny scripted "browser" for API tests: fetch with a cookie jar and manual redirects,
 * so a test can walk the OpenID Connect flow across Lagbook and the identity provider
 * exactly as a browser would, and inspect every hop.
 */
export class BrowserlessSession {
  readonly jar = new CookieJar();

  async request(url: string, init: { method?: string; form?: Record<string, string>; headers?: Record<string, string> } = {}): Promise<Response> {
    const headers: Record<string, string> = { ...init.headers };
    const cookie = await this.jar.getCookieString(url);
    if (cookie) headers.cookie = cookie;
    let body: string | undefined;
    if (init.form) {
      body = new URLSearchParams(init.form).toString();
      headers['content-type'] = 'application/x-www-form-urlencoded';
      headers.origin ??= new URL(url).origin;
    }
    const res = await fetch(url, { method: init.method ?? (body !== undefined ? 'POST' : 'GET'), headers, body, redirect: 'manual' });
    for (const setCookie of res.headers.getSetCookie()) await this.jar.setCookie(setCookie, url);
    return res;
  }

  /** Follows redirects from `url` until a non-redirect answer; returns it and the final URL. */
  async follow(url: string, init: Parameters<BrowserlessSession['request']>[1] = {}, maxHops = 15): Promise<{ res: Response; url: string; hops: string[] }> {
    let res = await this.request(url, init);
    const hops = [url];
    while (res.status >= 300 && res.status < 400 && res.headers.get('location')) {
      if (hops.length > maxHops) throw new Error(`too many redirects: ${hops.join(' → ')}`);
      url = new URL(res.headers.get('location')!, url).href;
      hops.push(url);
      res = await this.request(url);
    }
    return { res, url, hops };
  }
}

/** The action URL of the form with `id` in an HTML page (our stand-in's interaction pages). */
export function formAction(html: string, pageUrl: string, id: string): string {
  const match = new RegExp(`<form[^>]*action="([^"]+)"[^>]*id="${id}"|<form[^>]*id="${id}"[^>]*action="([^"]+)"`).exec(html);
  const action = match?.[1] ?? match?.[2];
  if (!action) throw new Error(`no form #${id} on ${pageUrl}:\n${html.slice(0, 500)}`);
  return new URL(action.replace(/&amp;/g, '&'), pageUrl).href;
}

export interface SignInOutcome {
  /** Where the flow ended (in Lagbook). */
  finalUrl: string;
  hops: string[];
  session: BrowserlessSession;
}

/**
 * Signs in to Lagbook at `appUrl` as a dev account through the identity provider's login
 * and consent pages. `consent: 'deny'` or a wrong password show the failure paths.
 */
export async function signInThroughProvider(
  appUrl: string,
  account: { email: string; password: string },
  opts: { consent?: 'allow' | 'deny'; session?: BrowserlessSession; returnTo?: string } = {},
): Promise<SignInOutcome> {
  const session = opts.session ?? new BrowserlessSession();
  const start = `${appUrl}/auth/sign-in${opts.returnTo ? `?returnTo=${encodeURIComponent(opts.returnTo)}` : ''}`;
  const login = await session.follow(start);
  if (login.res.status !== 200) throw new Error(`expected the provider's login page, got ${login.res.status} at ${login.url}`);
  const loginHtml = await login.res.text();
  const afterLogin = await session.follow(formAction(loginHtml, login.url, 'sign-in'), { form: { email: account.email, password: account.password } });
  if (afterLogin.url.startsWith(appUrl)) return { finalUrl: afterLogin.url, hops: [...login.hops, ...afterLogin.hops], session };
  if (afterLogin.res.status !== 200) {
    return { finalUrl: afterLogin.url, hops: [...login.hops, ...afterLogin.hops], session };
  }
  const consentHtml = await afterLogin.res.text();
  if (!consentHtml.includes('id="allow"')) {
    // still on the login page (wrong password): report where we are
    return { finalUrl: afterLogin.url, hops: [...login.hops, ...afterLogin.hops], session };
  }
  const choice = opts.consent === 'deny' ? 'deny' : 'allow';
  const done = await session.follow(formAction(consentHtml, afterLogin.url, choice), { form: {} });
  return { finalUrl: done.url, hops: [...login.hops, ...afterLogin.hops, ...done.hops], session };
}
