import type { RowProblem } from '../../api-types';
import type { Caller } from '../../auth/caller';
import { assertTeamAccess } from '../../auth/team-access';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { findService, findTeam, sketchExists } from '../../queries/sketches';
import { registrationInput, type RegistrationInput } from '../../routes/sketch-input';
import { targetsOf } from '../sketches/register';
import { checkTargetUrls, type TargetPolicy } from '../sketches/target-check';
import type { InventoryRow } from './inventory-rows';

export interface CheckedRow {
  line: number;
  input: Record<string, unknown>;
  registration: RegistrationInput | null;
  newService: boolean;
  problems: RowProblem[];
}

const asProblem = (error: unknown): RowProblem => {
  if (!(error instanceof AppError)) throw error;
  return { field: error.field, code: error.code, status: error.status, message: error.message };
};

/**
 * Checks every row as its own registration would be checked — the same
 * schema, team rule, ownership of the service, uniqueness and target-safety
 * check — without writing anything, and finds rows that repeat each other.
 */
export async function checkRows(db: Db, user: Caller, rows: InventoryRow[], policy: TargetPolicy): Promise<CheckedRow[]> {
  const firstLine = new Map<string, number>();
  const checked: CheckedRow[] = [];
  for (const row of rows) {
    const out: CheckedRow = { line: row.line, input: row.input, registration: null, newService: false, problems: row.problems.map((p) => ({ ...p, code: 'invalid', status: 400 })) };
    checked.push(out);
    if (out.problems.length) continue;
    const parsed = registrationInput.safeParse(row.input);
    if (!parsed.success) {
      out.problems = parsed.error.issues.map((issue) => ({ field: issue.path.join('.') || undefined, code: 'invalid', status: 400, message: issue.message }));
      continue;
    }
    const input = parsed.data;
    const key = `${input.service}\u0000${input.sketch}`;
    const earlier = firstLine.get(key);
    if (earlier !== undefined) {
      out.problems.push({ field: 'sketch', code: 'duplicate_row', status: 400, message: `The sketch ${input.sketch} of ${input.service} is also on line ${earlier}; keep one row per sketch.` });
    } else firstLine.set(key, row.line);
    out.problems.push(...(await registrationProblems(db, user, input, policy, out)));
    if (out.problems.length === 0) out.registration = input;
  }
  return checked;
}

async function registrationProblems(db: Db, user: Caller, input: RegistrationInput, policy: TargetPolicy, out: CheckedRow): Promise<RowProblem[]> {
  const problems: RowProblem[] = [];
  let urls: string[];
  try {
    urls = targetsOf(input).map((t) => t.url);
  } catch (error) {
    return [asProblem(error)];
  }
  const team = await findTeam(db, input.team);
  if (!team) return [{ field: 'team', code: 'invalid', status: 400, message: `team must be the slug of an existing team; there is no team ${input.team}.` }];
  try {
    assertTeamAccess(user, Number(team.id), `import a sketch for team ${team.slug}`);
  } catch (error) {
    problems.push({ ...asProblem(error), field: 'team' });
  }
  const service = await findService(db, input.service);
  out.newService = !service;
  if (service && Number(service.team_id) !== Number(team.id)) {
    const owner = await db('teams').where({ id: service.team_id }).first('slug');
    problems.push({ field: 'service', code: 'service_of_another_team', status: 409, message: `The service ${input.service} belongs to team ${owner?.slug}, not ${team.slug}.` });
  } else if (service && (await sketchExists(db, Number(service.id), input.sketch))) {
    problems.push({ field: 'sketch', code: 'sketch_exists', status: 409, message: `The service ${input.service} already has a sketch named ${input.sketch}; remove the row, or change the sketch on its own page.` });
  }
  try {
    await checkTargetUrls(urls, input.instances !== undefined, policy);
  } catch (error) {
    problems.push(asProblem(error));
  }
  return problems;
}
