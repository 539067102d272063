/** Words for the register pages (pure). */
export const CHOICE_WORDS: Record<string, string> = {
  approve: 'approve',
  'approve-with-conditions': 'approve with conditions',
  refuse: 'refuse',
  defer: 'defer',
  abstain: 'abstain',
};
