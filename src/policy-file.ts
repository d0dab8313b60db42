// POLICY_FILE: a team's agreed defaults (rankBy, confidence level, the AICc
// rule of thumb, Δ wording), read and checked once at start. Its hash — SHA-256
// of the canonical JSON of the policy as applied, defaults filled in — goes into
// every response so two dashboards can tell whether they used the same rules.
import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { DEFAULT_POLICY, type Policy } from './core/scoring/policy.ts';
import { canonicalJson, sha256Hex } from './audit/chain.ts';

const Band = z.strictObject({
  maxDelta: z.number().positive().nullable(),
  includeMax: z.boolean().default(true),
  wording: z.string().min(1).max(200),
});

const Bands = z
  .array(Band)
  .min(1)
  .superRefine((bands, ctx) => {
    bands.forEach((b, i) => {
      const last = i === bands.length - 1;
      if (last !== (b.maxDelta === null)) ctx.addIssue({ code: 'custom', path: [i, 'maxDelta'], message: 'only the last band is open-ended (maxDelta null)' });
      if (i > 0 && b.maxDelta !== null && bands[i - 1].maxDelta !== null && b.maxDelta <= bands[i - 1].maxDelta!) {
        ctx.addIssue({ code: 'custom', path: [i, 'maxDelta'], message: 'bands must rise' });
      }
    });
  });

export const PolicySchema = z.strictObject({
  name: z.string().min(1).max(200),
  // qaic and qaicc apply where a comparison has a ĉ; elsewhere aic and aicc stand in (chooseRankBy).
  rankBy: z.enum(['aicc', 'aic', 'bic', 'hqc', 'adjustedR2', 'qaic', 'qaicc']).default(DEFAULT_POLICY.rankBy),
  confidenceLevel: z.number().gt(0).lt(1).default(DEFAULT_POLICY.confidenceLevel),
  preferAiccBelowRatio: z.number().positive().nullable().default(DEFAULT_POLICY.preferAiccBelowRatio),
  akaikeBands: Bands.default(DEFAULT_POLICY.akaikeBands),
  bicBands: Bands.default(DEFAULT_POLICY.bicBands),
});

export interface ActivePolicy {
  policy: Policy;
  /** "sha256:" + hex of the canonical JSON of `policy`. */
  hash: string;
  source: 'default' | string;
}

export function activePolicy(policy: Policy, source: string): ActivePolicy {
  return { policy, hash: `sha256:${sha256Hex(canonicalJson(policy))}`, source };
}

export const DEFAULT_ACTIVE_POLICY: ActivePolicy = activePolicy(DEFAULT_POLICY, 'default');

export class PolicyFileError extends Error {}

export function loadPolicyFile(path: string | undefined): ActivePolicy {
  if (!path) return DEFAULT_ACTIVE_POLICY;
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(path, 'utf8'));
  } catch (error) {
    throw new PolicyFileError(`POLICY_FILE ${path}: ${error instanceof Error ? error.message : String(error)}`);
  }
  const parsed = PolicySchema.safeParse(raw);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.') || '(root)'}: ${i.message}`);
    throw new PolicyFileError(`POLICY_FILE ${path} is not a valid policy: ${lines.join('; ')}`);
  }
  return activePolicy(parsed.data, path);
}
