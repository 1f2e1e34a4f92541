import type { Knex } from 'knex';
import { DEMO_ACCOUNTS } from '../ops/oidc-provider/demo-accounts';

/**
 * The demo's people, one per role, as the local sign-in provider knows them,
 * in their teams (the owner in one team only). Their first sign-in finds
 * these rows by the provider's subject. Owners and responders get their
 * team's alert e-mail.
 */
export async function seed(knex: Knex): Promise<void> {
  const users = await knex('users')
    .insert(DEMO_ACCOUNTS.map((a) => ({ login: a.login, subject: a.subject, name: a.name, email: a.email, role: a.role })))
    .returning(['id', 'login']);
  const userId = new Map(users.map((u: { id: number; login: string }) => [u.login, u.id]));
  const teams: { id: number; slug: string }[] = await knex('teams').select('id', 'slug');
  const teamId = new Map(teams.map((t) => [t.slug, t.id]));
  const members = DEMO_ACCOUNTS.flatMap((a) =>
    a.teams.map((slug) => {
      const team = teamId.get(slug);
      if (team === undefined) throw new Error(`The demo account ${a.login} names team "${slug}", which the demo teams seed does not create.`);
      return { team_id: team, user_id: userId.get(a.login), wants_alert_mail: a.role === 'owner' || a.role === 'responder' };
    }),
  );
  await knex('team_members').insert(members);
}
