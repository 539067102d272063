/** A member's vote choices and their words (no zod here: the vote panel island imports this). */
export const VOTE_CHOICES = ['approve', 'approve-with-conditions', 'refuse', 'defer', 'abstain'] as const;
export type VoteChoice = (typeof VOTE_CHOICES)[number];
export const VOTE_LABELS: Record<VoteChoice, string> = {
  approve: 'Approve',
  'approve-with-conditions': 'Approve with conditions',
  refuse: 'Refuse',
  defer: 'Defer',
  abstain: 'Abstain',
};
