/** The board's settings (pure schema with defaults; stored in app_setting). */
import { z } from 'zod';

export const boardSettingsSchema = z.object({
  /** Eligible votes (cast by members without a declared conflict, abstentions included) needed before a decision is recorded. */
  'board.quorum': z.number().int().min(1).default(2),
  /** Days after the decision during which an appeal may be lodged; the authority sets it from its local law. */
  'board.appeal-days': z.number().int().min(0).max(365).default(28),
  /** Publish on the public register entry how each member voted (names and choices, never comments); off unless the authority's law asks for it. */
  'register.votes-public': z.boolean().default(false),
});

export type BoardSettings = z.output<typeof boardSettingsSchema>;
export const BOARD_SETTING_KEYS = Object.keys(boardSettingsSchema.shape) as (keyof BoardSettings)[];

export function readBoardSettings(rows: { key: string; value: unknown }[]): BoardSettings {
  const stored = Object.fromEntries(
    rows.filter((r) => (BOARD_SETTING_KEYS as string[]).includes(r.key)).map((r) => [r.key, r.value]),
  );
  const parsed = boardSettingsSchema.safeParse(stored);
  if (!parsed.success)
    throw new Error(
      `setting "${String(parsed.error.issues[0]!.path[0])}" is invalid: ${parsed.error.issues[0]!.message}`,
    );
  return parsed.data;
}

export { VOTE_CHOICES, VOTE_LABELS, type VoteChoice } from './vote-choices';
import type { VoteChoice } from './vote-choices';
export const DECISION_OUTCOMES = ['approved', 'approved-with-conditions', 'refused', 'deferred'] as const;
export type DecisionOutcome = (typeof DECISION_OUTCOMES)[number];

/** Votes that count toward the quorum: members who voted and declared no conflict on the item. */
export function tally(votes: { userId: string; choice: VoteChoice }[], conflicted: string[]) {
  const eligible = votes.filter((v) => !conflicted.includes(v.userId));
  const count = (c: VoteChoice) => eligible.filter((v) => v.choice === c).length;
  return {
    approve: count('approve'),
    approveWithConditions: count('approve-with-conditions'),
    refuse: count('refuse'),
    defer: count('defer'),
    abstain: count('abstain'),
    declaredConflicts: conflicted.length,
    eligible: eligible.length,
  };
}
