/** An upload's stored phase in the uploader's words, with counts where the server knows them (pure). */
import type { ServerPhase } from './types';

const n = (v: number) => v.toLocaleString('en-GB');

/** The phases in which the server is still working. */
export const RUNNING_PHASES: readonly ServerPhase[] = [
  'reading',
  'checking',
  'keeping',
  'comparing',
  'storing',
  'overlay',
];
/** Phases of the check; the rest of the running ones belong to the save. */
export const CHECK_PHASES: readonly ServerPhase[] = ['checking', 'keeping', 'comparing'];

export function phaseWords(
  p: { phase: ServerPhase; done: number | null; total: number | null },
  purpose: 'parcels' | 'reference',
): string {
  const noun = purpose === 'parcels' ? 'parcels' : 'features';
  const of = p.done !== null && p.total ? `: ${n(p.done)} of ${n(p.total)} ${noun}` : '';
  const all = p.total ? ` ${n(p.total)} ${noun}` : ` the ${noun}`;
  switch (p.phase) {
    case 'reading':
      return 'Reading the file';
    case 'staged':
      return 'File read: choose its columns next';
    case 'checking':
      return of
        ? `Checking boundaries${of}`
        : p.total
          ? `Checking the boundaries of${all}`
          : 'Reading the file to check it';
    case 'keeping':
      return `Checking and recording${of}`;
    case 'comparing':
      return purpose === 'parcels'
        ? `Comparing${all} with the register and the authority’s territory`
        : `Repairing and measuring${all}`;
    case 'validated':
      return 'Checked: the report is ready';
    case 'storing':
      return `Saving${all}`;
    case 'overlay':
      return `Overlaying the saved ${noun} with the climate, soil and designation layers`;
    case 'saved':
      return 'Saved';
    case 'failed':
      return 'Stopped';
    case 'cancelled':
      return 'Cancelled';
  }
}

/** The share done (0-1) when the server counts this phase, else null (the bar then shows no amount). */
export function shareDone(p: { done: number | null; total: number | null }): number | null {
  return p.done !== null && p.total ? Math.min(1, p.done / p.total) : null;
}
