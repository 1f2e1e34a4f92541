import { DEMO_ACCOUNTS } from './demo-accounts';

const escape = (text: string) =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

const style = `
  body { font: 15px/1.5 system-ui, sans-serif; background: #f4f4f2; color: #222; margin: 0; }
  main { max-width: 34rem; margin: 3rem auto; background: #fff; padding: 2rem; border: 1px solid #ddd; border-radius: 6px; }
  h1 { font-size: 1.3rem; margin-top: 0; }
  label { display: block; margin: .8rem 0 .2rem; }
  input { width: 100%; box-sizing: border-box; padding: .45rem; font: inherit; border: 1px solid #aaa; border-radius: 4px; }
  .actions { display: flex; gap: .6rem; margin-top: 1.2rem; }
  button { font: inherit; padding: .45rem 1.1rem; border-radius: 4px; border: 1px solid #555; background: #333; color: #fff; cursor: pointer; }
  button.quiet { background: #fff; color: #333; }
  .refused { background: #fdecea; border: 1px solid #e0a39a; padding: .6rem; border-radius: 4px; }
  table { width: 100%; border-collapse: collapse; margin-top: .5rem; font-size: .9rem; }
  th, td { text-align: left; padding: .25rem .4rem; border-bottom: 1px solid #eee; }
  code { font-size: .95em; }`;

/** The local provider's own sign-in form, listing the demo accounts (all share the password "demo"). */
export function signInPage(uid: string, clientId: string, options: { login?: string; refusal?: string } = {}): string {
  const rows = DEMO_ACCOUNTS.map(
    (a) => `<tr><td><code>${escape(a.login)}</code></td><td>${escape(a.name)}</td><td>${escape(a.role)}</td><td>${escape(a.email)}</td></tr>`,
  ).join('');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Local sign-in provider</title><style>${style}</style></head>
<body><main>
<h1>Local sign-in provider</h1>
<p>A development stand-in for your organisation's OpenID Connect provider. <b>${escape(clientId)}</b> asks who you are.</p>
${options.refusal ? `<p class="refused" role="alert">${escape(options.refusal)}</p>` : ''}
<form method="post" action="/interaction/${escape(uid)}/login" autocomplete="off">
  <label for="login">Login</label>
  <input id="login" name="login" required autofocus value="${escape(options.login ?? '')}">
  <label for="password">Password</label>
  <input id="password" name="password" type="password" required>
  <div class="actions"><button type="submit">Sign in</button>
  <button class="quiet" type="submit" formaction="/interaction/${escape(uid)}/abort" formnovalidate>Cancel</button></div>
</form>
<h2 style="font-size:1rem;margin-top:1.8rem">Demo accounts (password <code>demo</code>)</h2>
<table><thead><tr><th>login</th><th>name</th><th>role</th><th>e-mail</th></tr></thead><tbody>${rows}</tbody></table>
</main></body></html>`;
}

/** Shown for the provider's own errors, instead of its default page (which loads web fonts from the internet). */
export function errorPage(title: string, detail: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Sign-in problem</title><style>${style}</style></head>
<body><main><h1>${escape(title)}</h1><p>${escape(detail)}</p><p>Go back to Brimwatch and start the sign-in again.</p></main></body></html>`;
}
