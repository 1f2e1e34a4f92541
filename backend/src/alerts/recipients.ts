import type { Q } from './alert-store';

/**
 * Who hears about a team's sketches: its alert address and each member who
 * asked for alert mail; its escalation address too when an alert escalates.
 * Addresses are compared without case so nobody gets a message twice.
 */
export async function recipientsOf(q: Q, teamId: number, escalate: boolean): Promise<string[]> {
  const team = await q('teams').where({ id: teamId }).first('alert_email', 'escalation_email');
  const members: string[] = await q('team_members as tm')
    .join('users as u', 'u.id', 'tm.user_id')
    .where({ 'tm.team_id': teamId, 'tm.wants_alert_mail': true })
    .whereNotNull('u.email')
    .orderBy('u.email')
    .pluck('u.email');
  const all = [team?.alert_email, ...members, escalate ? team?.escalation_email : null];
  const seen = new Map<string, string>();
  for (const address of all) {
    if (typeof address === 'string' && address.trim() !== '' && !seen.has(address.trim().toLowerCase())) seen.set(address.trim().toLowerCase(), address.trim());
  }
  return [...seen.values()];
}
