import type { TargetTest } from '../../api-types';
import { assess } from '../../maths/assess';
import { scrapeOnce } from '../../../../collectors/scrape-once';
import type { TestTargetInput } from '../../routes/sketch-input';
import type { TargetPolicy } from './target-check';

/**
 * "Test the target" before saving: one scrape through the collectors' own code
 * (same safety check, limits and reader), answering with what Brimwatch reads
 * or exactly why it could not. With a budget and confidence, also the load
 * that reading would give.
 */
export async function testTarget(input: TestTargetInput, policy: TargetPolicy): Promise<TargetTest> {
  const outcome = await scrapeOnce(input.targetUrl, input.sketch, { allowlist: policy.allowlist, maxBytes: policy.maxBytes, resolve: policy.resolve });
  const asked = { targetUrl: input.targetUrl, sketch: input.sketch };
  if (!outcome.ok) return { ok: false, ...asked, kind: outcome.kind, reason: outcome.reason, scrapeMs: outcome.scrapeMs };
  const s = outcome.sample;
  const assessment =
    input.errorBudget !== undefined && input.confidence !== undefined
      ? assess({ width: s.width, depth: s.depth, errorBudget: input.errorBudget, confidence: input.confidence, streamTotal: s.streamTotal, watchLine: input.watchLine })
      : null;
  return { ok: true, ...asked, reading: { ...s, memoryBytes: s.width * s.depth * s.counterBytes }, occupancy: outcome.occupancy, assessment, scrapeMs: outcome.scrapeMs };
}
