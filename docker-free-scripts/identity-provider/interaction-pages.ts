/**
 * Server-rendered pages of the local identity provider stand-in. They say plainly that they
 * stand in for a lab's institutional sign-in on a developer's machine; every value echoed
 * back is HTML-escaped.
 */

const HTML_ESCAPES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** Escapes text for HTML element content and double- or single-quoted attribute values. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (character) => HTML_ESCAPES[character]);
}

const STYLE = `
  body { margin: 0; min-height: 100vh; display: grid; place-items: center; background: #eef1ea;
    font: 16px/1.45 system-ui, sans-serif; color: #1f2a24; }
  main { width: min(26rem, 92vw); background: #fffdf7; border: 2px dashed #8a9a5b; padding: 1.5rem 1.75rem; }
  .ribbon { margin: -1.5rem -1.75rem 1.25rem; padding: .4rem 1.75rem; background: #8a9a5b; color: #fffdf7;
    font-size: .8rem; letter-spacing: .04em; text-transform: uppercase; }
  h1 { font-size: 1.3rem; margin: 0 0 .75rem; }
  label { display: block; margin-top: .9rem; font-weight: 600; }
  input { width: 100%; box-sizing: border-box; margin-top: .25rem; padding: .5rem; font: inherit;
    border: 1px solid #9aa39b; background: #fff; }
  .actions { display: flex; gap: .75rem; margin-top: 1.25rem; }
  button { font: inherit; padding: .5rem 1.1rem; border: 1px solid #3d5a40; cursor: pointer; }
  button.go { background: #3d5a40; color: #fff; }
  button.stop { background: #fff; color: #3d5a40; }
  .problem { border-left: 4px solid #b5462f; background: #fbeee9; padding: .5rem .75rem; margin: .75rem 0 0; }
  ul { padding-left: 1.2rem; }
  small { color: #5b665f; }
`;

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · local sign-in stand-in</title>
<style>${STYLE}</style>
</head>
<body>
<main>
<div class="ribbon">Local stand-in for your institution's sign-in · development only</div>
${body}
</main>
</body>
</html>`;
}

/** Parameters of the login form; `problem` is shown above the form after a failed attempt. */
export interface LoginPageInput {
  uid: string;
  clientId: string;
  email?: string;
  problem?: string;
}

/** The e-mail and password form that starts an interaction, with a separate Cancel form. */
export function renderLoginPage({ uid, clientId, email = '', problem }: LoginPageInput): string {
  const action = `/interaction/${encodeURIComponent(uid)}`;
  return page(
    'Sign in',
    `<h1>Sign in to continue to ${escapeHtml(clientId)}</h1>
<p><small>Use one of the dev accounts printed when the services started.</small></p>
${problem ? `<p class="problem" role="alert">${escapeHtml(problem)}</p>` : ''}
<form method="post" action="${action}/login" id="sign-in">
  <label for="email">E-mail</label>
  <input id="email" name="email" type="email" autocomplete="username" required value="${escapeHtml(email)}">
  <label for="password">Password</label>
  <input id="password" name="password" type="password" autocomplete="current-password" required>
</form>
<form method="post" action="${action}/abort" id="cancel"></form>
<div class="actions">
  <button class="go" type="submit" form="sign-in">Sign in</button>
  <button class="stop" type="submit" form="cancel">Cancel</button>
</div>`,
  );
}

/** Parameters of the consent page. */
export interface ConsentPageInput {
  uid: string;
  clientId: string;
  accountEmail: string;
  scopes: readonly string[];
}

const SCOPE_MEANINGS: Record<string, string> = {
  openid: 'a stable identifier for your account',
  email: 'your e-mail address and whether it is confirmed',
  profile: 'your full name',
};

/** The Allow / Deny page listing what the relying party will learn about the account. */
export function renderConsentPage({ uid, clientId, accountEmail, scopes }: ConsentPageInput): string {
  const action = `/interaction/${encodeURIComponent(uid)}`;
  const items = scopes.map((scope) => `<li>${escapeHtml(SCOPE_MEANINGS[scope] ?? scope)} <small>(${escapeHtml(scope)})</small></li>`).join('\n');
  return page(
    'Share your details',
    `<h1>${escapeHtml(clientId)} would like to know who you are</h1>
<p>Signed in as <strong>${escapeHtml(accountEmail)}</strong>. Sharing gives it:</p>
<ul>
${items}
</ul>
<form method="post" action="${action}/abort" id="deny"></form>
<form method="post" action="${action}/confirm" id="allow"></form>
<div class="actions">
  <button class="go" type="submit" form="allow">Allow</button>
  <button class="stop" type="submit" form="deny">Deny</button>
</div>`,
  );
}

/** A page with a heading and a few lines of explanation, for errors and the sign-out steps. */
export function renderNoticePage(title: string, lines: readonly string[], extraHtml = ''): string {
  const paragraphs = lines.map((line) => `<p>${escapeHtml(line)}</p>`).join('\n');
  return page(title, `<h1>${escapeHtml(title)}</h1>\n${paragraphs}\n${extraHtml}`);
}
