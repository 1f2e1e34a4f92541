import type { Role } from '../../backend/src/auth/roles';

/**
 * The demo's people at Larkfield Market (an invented marketplace), one per
 * role. The local sign-in provider accepts them with DEMO_PASSWORD; the demo
 * seed links them to the teams named here (by slug, see seeds/).
 */
export interface DemoAccount {
  login: string;
  /** The provider's stable subject identifier for this person. */
  subject: string;
  name: string;
  email: string;
  role: Role;
  teams: string[];
}

export const DEMO_PASSWORD = 'demo';

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { login: 'admin', subject: 'lm-0001', name: 'Ines Halvorsen', email: 'ines.halvorsen@larkfield.test', role: 'admin', teams: [] },
  { login: 'sre', subject: 'lm-0002', name: 'Tomasz Achterberg', email: 'tomasz.achterberg@larkfield.test', role: 'sre', teams: ['edge'] },
  { login: 'owner', subject: 'lm-0003', name: 'Priya Rautenbach', email: 'priya.rautenbach@larkfield.test', role: 'owner', teams: ['payments'] },
  { login: 'responder', subject: 'lm-0004', name: 'Kwame Oyelaran', email: 'kwame.oyelaran@larkfield.test', role: 'responder', teams: ['payments', 'discovery'] },
  { login: 'viewer', subject: 'lm-0005', name: 'Maren Solbakk', email: 'maren.solbakk@larkfield.test', role: 'viewer', teams: [] },
];

export function demoAccountByLogin(login: string): DemoAccount | undefined {
  return DEMO_ACCOUNTS.find((a) => a.login === login);
}

export function demoAccountBySubject(subject: string): DemoAccount | undefined {
  return DEMO_ACCOUNTS.find((a) => a.subject === subject);
}
