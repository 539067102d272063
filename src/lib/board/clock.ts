/** The statutory clock of an agenda item (pure). */
import { daysLeft } from '../proposals/states';

const today = () => new Date().toISOString().slice(0, 10);

export type ClockState = 'overdue' | 'near' | 'running' | 'stopped';

/** The statutory clock of an item: overdue, near (within the reminder days), running, or stopped (decided or no deadline). */
export function clockOf(decisionDue: string | null, state: string, reminderDays: number, on = today()) {
  if (!decisionDue) return { decisionDue: null, daysLeft: null, state: 'stopped' as ClockState };
  const left = ['decided', 'withdrawn'].includes(state) ? null : daysLeft(decisionDue, on);
  const s: ClockState = left === null ? 'stopped' : left < 0 ? 'overdue' : left <= reminderDays ? 'near' : 'running';
  return { decisionDue, daysLeft: left, state: s };
}
