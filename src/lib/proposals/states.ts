/**
 * The life of a proposal (pure: islands import it). A transition is allowed only from the states
 * listed, and only to callers holding one of the roles listed. `on-agenda` and `decided` belong to
 * the board's work; `assessed` is reached only by signing an assessment off.
 */
import type { Role } from '../auth/roles';

export const PROPOSAL_STATES = [
  'draft',
  'submitted',
  'returned',
  'in-assessment',
  'assessed',
  'on-agenda',
  'decided',
  'withdrawn',
] as const;
export type ProposalState = (typeof PROPOSAL_STATES)[number];

export const STATE_LABELS: Record<ProposalState, string> = {
  draft: 'Draft',
  submitted: 'Submitted',
  returned: 'Returned for more information',
  'in-assessment': 'Being assessed',
  assessed: 'Assessed (signed off)',
  'on-agenda': 'On a board agenda',
  decided: 'Decided',
  withdrawn: 'Withdrawn',
};

export type Transition = {
  to: ProposalState;
  from: readonly ProposalState[];
  roles: readonly Role[];
  /** A reason must be given (it is shown to the planner and kept in the history). */
  reasonRequired: boolean;
  /** Reached only through another action (e.g. signing an assessment off), never asked for directly. */
  viaAction?: string;
  label: string;
};

export const TRANSITIONS: readonly Transition[] = [
  {
    to: 'submitted',
    from: ['draft', 'returned'],
    roles: ['planner'],
    reasonRequired: false,
    label: 'Submit for assessment',
  },
  {
    to: 'in-assessment',
    from: ['submitted'],
    roles: ['assessor'],
    reasonRequired: false,
    label: 'Start the assessment',
  },
  {
    to: 'returned',
    from: ['submitted', 'in-assessment'],
    roles: ['assessor'],
    reasonRequired: true,
    label: 'Return to the planner for more information',
  },
  {
    to: 'assessed',
    from: ['in-assessment'],
    roles: ['assessor'],
    reasonRequired: false,
    viaAction: 'sign the assessment off',
    label: 'Sign off',
  },
  {
    to: 'in-assessment',
    from: ['assessed'],
    roles: ['assessor'],
    reasonRequired: true,
    label: 'Reopen the assessment',
  },
  {
    to: 'on-agenda',
    from: ['assessed'],
    roles: ['chair', 'admin'],
    reasonRequired: false,
    viaAction: 'put it on a board meeting’s agenda',
    label: 'Put on an agenda',
  },
  {
    to: 'decided',
    from: ['on-agenda'],
    roles: ['chair', 'admin'],
    reasonRequired: false,
    viaAction: 'record the board’s decision',
    label: 'Record the decision',
  },
  {
    to: 'withdrawn',
    from: ['draft', 'submitted', 'returned', 'in-assessment', 'assessed', 'on-agenda'],
    roles: ['planner'],
    reasonRequired: true,
    label: 'Withdraw',
  },
];

/** States in which a planner may still change the proposal's content. */
export const EDITABLE_STATES: readonly ProposalState[] = ['draft', 'returned'];

export type TransitionCheck =
  | { ok: true; transition: Transition }
  | { ok: false; code: 'CONFLICT' | 'FORBIDDEN' | 'UNPROCESSABLE_CONTENT'; message: string };

/** Whether `roles` may move a proposal from `from` to `to`, and if not, why (409 = the state machine, 403 = the role). */
export function checkTransition(
  from: ProposalState,
  to: ProposalState,
  roles: readonly Role[],
  reason: string | undefined,
): TransitionCheck {
  const byState = TRANSITIONS.filter((t) => t.to === to && t.from.includes(from));
  if (byState.length === 0)
    return {
      ok: false,
      code: 'CONFLICT',
      message: `A proposal that is "${STATE_LABELS[from]}" cannot move to "${STATE_LABELS[to]}".`,
    };
  const t = byState.find((x) => x.roles.some((r) => roles.includes(r)));
  if (!t)
    return {
      ok: false,
      code: 'FORBIDDEN',
      message: `Moving a proposal to "${STATE_LABELS[to]}" needs the role: ${byState.flatMap((x) => x.roles).join(' or ')}.`,
    };
  if (t.viaAction)
    return {
      ok: false,
      code: 'CONFLICT',
      message: `A proposal becomes "${STATE_LABELS[to]}" only when you ${t.viaAction}.`,
    };
  if (t.reasonRequired && !(reason && reason.trim().length >= 3))
    return {
      ok: false,
      code: 'UNPROCESSABLE_CONTENT',
      message: 'Give a reason (at least 3 characters); it is kept in the proposal history.',
    };
  return { ok: true, transition: t };
}

/** The transitions `roles` could ask for now (for the buttons on the proposal page). */
export function availableTransitions(from: ProposalState, roles: readonly Role[]): Transition[] {
  return TRANSITIONS.filter((t) => !t.viaAction && t.from.includes(from) && t.roles.some((r) => roles.includes(r)));
}

/** Whole days from `today` to the deadline (negative when overdue); dates "YYYY-MM-DD". */
export function daysLeft(deadline: string, today: string): number {
  return Math.round((Date.parse(`${deadline}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / 86_400_000);
}

export function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
}
