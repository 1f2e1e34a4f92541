import os from 'node:os';
import { parseArgs } from 'node:util';
import { ConfigError, loadConfig } from '../backend/src/config';
import { createDb } from '../backend/src/db';
import { AppError } from '../backend/src/http/errors';
import { isRole, roleList } from '../backend/src/auth/roles';
import { createToken } from '../backend/src/services/access/tokens';
import { setRole, userForLogin, UsageError } from './admin/users';

/**
 * Operator commands against the database in DATABASE_URL (or npm start's cluster):
 *   npm run admin -- token create --login <login> --label <label> [--role <role>] [--days <n>]
 *   npm run admin -- user role --login <login> --role <role>
 * `token create` prints the new token alone on its last line, so scripts can take `| tail -1`.
 */
const usage = `Usage:
  npm run admin -- token create --login <login> --label <label> [--role <role>] [--days <days>]
  npm run admin -- user role --login <login> --role <role>
Roles: ${roleList}.`;

const { positionals, values } = parseArgs({
  allowPositionals: true,
  strict: false,
  options: { login: { type: 'string' }, label: { type: 'string' }, role: { type: 'string' }, days: { type: 'string' } },
});
const text = (name: keyof typeof values) => (typeof values[name] === 'string' ? (values[name] as string).trim() : '');
const actor = { login: `cli:${os.userInfo().username}` };

async function run(): Promise<void> {
  const config = loadConfig();
  const command = positionals.slice(0, 2).join(' ');
  if (command !== 'token create' && command !== 'user role') throw new UsageError(`Unknown command "${command}".`);
  if (!text('login')) throw new UsageError('--login is required.');
  const given = text('role');
  if (given && !isRole(given)) throw new UsageError(`--role must be one of ${roleList} (got "${given}").`);
  const role = isRole(given) ? given : undefined;
  const db = createDb(config.databaseUrl, { max: 2 });
  try {
    if (command === 'user role') {
      if (!role) throw new UsageError('--role is required.');
      const user = await setRole(db, actor.login, text('login'), role);
      console.log(`${user.login} is now ${user.role}.`);
      return;
    }
    if (!text('label')) throw new UsageError('--label is required: say what the token is for, such as --label "deploy pipeline".');
    const days = text('days') ? Number(text('days')) : config.TOKEN_DEFAULT_DAYS;
    if (!Number.isInteger(days) || days < 1 || days > config.TOKEN_MAX_DAYS) throw new UsageError(`--days must be a whole number from 1 to ${config.TOKEN_MAX_DAYS}.`);
    const user = await userForLogin(db, actor, text('login'));
    const { token, secret } = await createToken(db, actor, { userId: user.id, label: text('label'), role: role ?? user.role, expiresInDays: days });
    console.log(`API token "${token.label}" for ${user.login}, role ${token.role}, expires ${new Date(token.expiresAt).toISOString()}. Shown once; send it as "Authorization: Bearer <token>":`);
    console.log(secret);
  } finally {
    await db.destroy();
  }
}

try {
  await run();
} catch (err) {
  if (err instanceof UsageError) console.error(`${err.message}\n${usage}`);
  else if (err instanceof ConfigError || err instanceof AppError) console.error(err.message);
  else console.error(`The admin command failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = err instanceof UsageError ? 2 : 1;
}
