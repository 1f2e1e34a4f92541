import { z } from 'zod';
import { ALERT_LEVELS } from '../alerts/settings';

const level = z.enum(ALERT_LEVELS as [string, ...string[]], `level must be one or more of ${ALERT_LEVELS.join(', ')} (comma-separated)`);

export const alertListInput = z.strictObject({
  state: z.enum(['live', 'open', 'acknowledged', 'resolved', 'all'], 'state must be live (open or acknowledged), open, acknowledged, resolved or all').default('live'),
  level: z
    .string()
    .optional()
    .transform((v) => (v ? v.split(',').map((s) => s.trim()).filter(Boolean) : []))
    .pipe(z.array(level)),
  team: z.string().trim().min(1, 'team must be a team slug such as payments').optional(),
  service: z.string().trim().min(1, 'service must be a service name such as checkout').optional(),
  sketch: z.coerce.number('sketch must be a sketch id').int('sketch must be a whole number').positive('sketch must be a sketch id').optional(),
  limit: z.coerce.number('limit must be a whole number from 1 to 500').int().min(1, 'limit must be a whole number from 1 to 500').max(500, 'limit must be a whole number from 1 to 500').default(200),
});

export const acknowledgeInput = z.strictObject({
  note: z.string('note must be text, such as "resizing in today\'s deploy"').trim().max(500, 'note must be at most 500 characters').optional(),
});

const moment = (field: string) => z.iso.datetime({ offset: true, error: `${field} must be a date and time with its zone, such as 2026-12-01T14:00:00Z` });

export const quietWindowInput = z
  .strictObject({
    scope: z.enum(['sketch', 'service', 'team'], 'scope must be sketch, service or team: what the window quiets'),
    sketchId: z.number('sketchId must be a sketch id (a number)').int().positive().optional(),
    service: z.string('service must be a service name such as checkout').trim().min(1, 'service must not be empty').optional(),
    team: z.string('team must be a team slug such as payments').trim().min(1, 'team must not be empty').optional(),
    startsAt: moment('startsAt').optional(),
    endsAt: moment('endsAt'),
    reason: z.string('reason is required: say why, e.g. "checkout load test"').trim().min(1, 'reason must say why, e.g. "checkout load test"').max(300, 'reason must be at most 300 characters'),
  })
  .superRefine((input, ctx) => {
    const field = { sketch: 'sketchId', service: 'service', team: 'team' } as const;
    const wanted = field[input.scope];
    if (input[wanted] === undefined) ctx.addIssue({ code: 'custom', path: [wanted], message: `A quiet window for a ${input.scope} needs ${wanted}.` });
    for (const other of Object.values(field)) {
      if (other !== wanted && input[other] !== undefined) {
        ctx.addIssue({ code: 'custom', path: [other], message: `${other} does not go with scope ${input.scope}; send only ${wanted}, or change the scope.` });
      }
    }
  })
  .transform((input) => ({ ...input, startsAt: input.startsAt ? new Date(input.startsAt) : undefined, endsAt: new Date(input.endsAt) }));

export const quietListInput = z.strictObject({
  when: z.enum(['active', 'past', 'all'], 'when must be active (in force or upcoming), past or all').default('active'),
  team: z.string().trim().min(1, 'team must be a team slug such as payments').optional(),
});
