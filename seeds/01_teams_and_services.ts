import type { Knex } from 'knex';

/**
 * The demo scenario: Larkfield Market, an invented online marketplace. Its
 * teams and people are fictional; every address is on the .test domain.
 */
export const demoTeams = [
  { slug: 'payments', name: 'Payments', alert_email: 'payments-alerts@larkfield.test', escalation_email: 'payments-oncall@larkfield.test' },
  { slug: 'discovery', name: 'Discovery', alert_email: 'discovery-alerts@larkfield.test', escalation_email: 'discovery-oncall@larkfield.test' },
  { slug: 'ads', name: 'Ads Ranking', alert_email: 'ads-alerts@larkfield.test', escalation_email: 'ads-oncall@larkfield.test' },
  { slug: 'trust', name: 'Trust & Safety', alert_email: 'trust-alerts@larkfield.test', escalation_email: 'trust-oncall@larkfield.test' },
  { slug: 'edge', name: 'Edge Platform', alert_email: 'edge-alerts@larkfield.test', escalation_email: 'edge-oncall@larkfield.test' },
];

export const demoServices = [
  { name: 'checkout', team: 'payments', description: 'Takes payment for a basket; limits attempts per card.' },
  { name: 'search', team: 'discovery', description: 'Product search; finds the heaviest queries.' },
  { name: 'ads-ranking', team: 'ads', description: 'Ranks sponsored listings; caps how often one ad is shown to a shopper.' },
  { name: 'abuse-screen', team: 'trust', description: 'Screens sign-ups and messages for abuse patterns.' },
  { name: 'api-gateway', team: 'edge', description: 'Front door for partner APIs; enforces per-key quotas.' },
];

export async function seed(knex: Knex): Promise<void> {
  const teams = await knex('teams').insert(demoTeams).returning(['id', 'slug']);
  const teamId = new Map(teams.map((t: { id: number; slug: string }) => [t.slug, t.id]));
  await knex('services').insert(demoServices.map((s) => ({ name: s.name, team_id: teamId.get(s.team), description: s.description })));
}
