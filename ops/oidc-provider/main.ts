import { ConfigError, loadConfig } from '../../backend/src/config';
import { startProvider } from './provider';

/**
 * The local sign-in provider as its own process (`npm start` runs it):
 * `npx tsx ops/oidc-provider/main.ts`, on HOST:OIDC_PORT, issuer OIDC_ISSUER.
 * Development only: it signs in the demo accounts with the password "demo".
 */
let config;
try {
  config = loadConfig();
} catch (err) {
  console.error(err instanceof ConfigError ? err.message : String(err));
  process.exit(1);
}
const running = await startProvider({
  host: config.HOST,
  port: config.OIDC_PORT,
  issuer: config.oidcIssuer,
  clients: [{ clientId: config.OIDC_CLIENT_ID, clientSecret: config.OIDC_CLIENT_SECRET, redirectUris: [`${config.publicUrl}/api/auth/callback`] }],
});
console.log(`[sign-in] local OpenID Connect provider on ${running.issuer} (demo logins: admin, sre, owner, responder, viewer; password: demo)`);

const shutdown = async () => {
  await running.close();
  process.exit(0);
};
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
