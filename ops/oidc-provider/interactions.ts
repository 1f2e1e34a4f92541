import type { IncomingMessage, ServerResponse } from 'node:http';
import type Provider from 'oidc-provider';
import { DEMO_PASSWORD, demoAccountByLogin } from './demo-accounts';
import { errorPage, signInPage } from './sign-in-page';

const MAX_FORM_BYTES = 4096;

/** The provider's sign-in steps: show the form, check the demo password, or cancel. */
export function interactionHandler(provider: Provider) {
  return async (req: IncomingMessage, res: ServerResponse): Promise<void> => {
    try {
      const [, , uid, step] = new URL(req.url ?? '/', 'http://local').pathname.split('/');
      const details = await provider.interactionDetails(req, res);
      if (details.uid !== uid) return send(res, 400, errorPage('Sign-in expired', 'This sign-in form belongs to another attempt.'));
      const clientId = String(details.params.client_id ?? 'an application');

      if (req.method === 'GET' && step === undefined) return send(res, 200, signInPage(uid, clientId));
      if (req.method !== 'POST') return send(res, 405, errorPage('Not allowed', 'Use the sign-in form.'));

      const form = new URLSearchParams(await readBody(req));
      if (step === 'abort') {
        return provider.interactionFinished(req, res, { error: 'access_denied', error_description: 'The person cancelled the sign-in.' }, { mergeWithLastSubmission: false });
      }
      if (step !== 'login') return send(res, 404, errorPage('Not found', 'There is no such sign-in step.'));

      const login = (form.get('login') ?? '').trim();
      const account = demoAccountByLogin(login);
      if (!account || form.get('password') !== DEMO_PASSWORD) {
        return send(res, 401, signInPage(uid, clientId, { login, refusal: 'Wrong login or password. Pick one of the demo accounts below; the password is "demo".' }));
      }
      await provider.interactionFinished(req, res, { login: { accountId: account.subject } }, { mergeWithLastSubmission: false });
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err);
      send(res, 400, errorPage('Sign-in could not continue', `${message}. The attempt may have expired.`));
    }
  };
}

function send(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' }).end(html);
}

async function readBody(req: IncomingMessage): Promise<string> {
  let body = '';
  for await (const chunk of req) {
    body += chunk;
    if (body.length > MAX_FORM_BYTES) throw new Error('The form is too large');
  }
  return body;
}
