/** Where the wizard resumes for each stored state, and the progress in words (common practice: counts in en-GB figures). */
import { describe, expect, it } from 'vitest';
import { phaseWords, shareDone } from '~/components/uploads/progress-words';
import { phasesOf, restoredView } from '~/components/uploads/restore';
import type { UploadStatus } from '~/components/uploads/types';

const staged = { id: 'u1', fileName: 'fields.zip', layers: [{ name: 'fields' }, { name: 'other' }] } as never;
const base: UploadStatus = {
  id: 'u1',
  purpose: 'parcels',
  fileName: 'fields.zip',
  state: 'staged',
  phase: 'staged',
  failedIn: null,
  done: null,
  total: null,
  startedAt: '2026-12-03T00:00:00Z',
  phaseStartedAt: '2026-12-03T00:00:00Z',
  updatedAt: '2026-12-03T00:00:00Z',
  message: null,
  staged,
  choice: null,
  report: null,
  saved: null,
};
const report = { summary: { total: 3 } } as never;

describe('progress in words', () => {
  it('names the phase with the counts the server knows', () => {
    expect(phaseWords({ phase: 'checking', done: 12400, total: 20000 }, 'parcels')).toBe(
      'Checking boundaries: 12,400 of 20,000 parcels',
    );
    expect(phaseWords({ phase: 'checking', done: null, total: 20000 }, 'parcels')).toBe(
      'Checking the boundaries of 20,000 parcels',
    );
    expect(phaseWords({ phase: 'checking', done: null, total: null }, 'parcels')).toBe('Reading the file to check it');
    expect(phaseWords({ phase: 'storing', done: null, total: 1500 }, 'reference')).toBe('Saving 1,500 features');
    for (const phase of ['comparing', 'overlay', 'keeping'] as const)
      expect(phaseWords({ phase, done: 0, total: 10 }, 'parcels')).not.toMatch(/[a-z]+-[a-z]+/);
  });

  it('gives a share only when counted, never above one', () => {
    expect(shareDone({ done: 5, total: 20 })).toBe(0.25);
    expect(shareDone({ done: null, total: 20 })).toBeNull();
    expect(shareDone({ done: 30, total: 20 })).toBe(1);
  });
});

describe('resuming an upload', () => {
  it('goes to the step the stored state calls for', () => {
    expect(restoredView(base)).toMatchObject({ step: 'mapping', layerName: 'fields', mapping: null, error: null });
    const chosen = { ...base, choice: { layer: 'other', epsg: 27700, mapping: { reference: 'ref' } } };
    expect(restoredView({ ...chosen, state: 'validated', report })).toMatchObject({
      step: 'report',
      layerName: 'other',
      epsg: 27700,
      mapping: { reference: 'ref' },
    });
    expect(restoredView({ ...base, state: 'running', phase: 'comparing' }).step).toBe('working');
    const saved = { batchId: 'b1', purpose: 'parcels', saved: 3, rejected: 0, referenceVersion: null };
    expect(restoredView({ ...base, state: 'saved', staged: null, saved }).step).toBe('saved');
  });

  it('shows a failure where it can be fixed, and sends gone uploads back to the file', () => {
    const failed = { ...base, state: 'failed' as const, phase: 'failed' as const, message: 'No column "x".' };
    expect(restoredView({ ...failed, failedIn: 'checking' })).toMatchObject({
      step: 'mapping',
      error: 'No column "x".',
    });
    expect(restoredView({ ...failed, failedIn: 'storing', report })).toMatchObject({ step: 'report' });
    expect(restoredView({ ...failed, staged: null })).toMatchObject({ step: 'file', error: 'No column "x".' });
    expect(restoredView({ ...base, state: 'cancelled', staged: null }).error).toMatch(/was cancelled/);
    expect(restoredView({ ...base, state: 'expired', staged: null }).error).toMatch(/has expired/);
  });

  it('marks the wizard’s phases from the stored state', () => {
    expect(phasesOf({ ...base, state: 'running', phase: 'keeping' })).toMatchObject({
      validate: { state: 'running' },
      save: { state: 'waiting' },
    });
    expect(phasesOf({ ...base, state: 'running', phase: 'overlay' })).toMatchObject({
      validate: { state: 'done' },
      save: { state: 'running' },
    });
    expect(phasesOf({ ...base, state: 'failed', phase: 'failed', failedIn: 'storing' }).save.state).toBe('failed');
  });
});
