/**
 * The four risk levels of a grade (pure: islands import it). The names are our own and say what
 * the authority does next; each level also has its own shape, so no level depends on colour.
 */
export type RiskLevel = 1 | 2 | 3 | 4;

/** Shape keys drawn by RiskBadge: a ring, a diamond, a triangle, a square with a bar across. */
export type LevelShape = 'ring' | 'diamond' | 'triangle' | 'barred-square';

export interface LevelInfo {
  level: RiskLevel;
  label: string;
  shape: LevelShape;
  /** One sentence for the legend and screen readers. */
  meaning: string;
}

export const LEVELS: Record<RiskLevel, LevelInfo> = {
  1: { level: 1, label: 'Routine', shape: 'ring', meaning: 'No rule of the set fired; the usual assessment applies.' },
  2: {
    level: 2,
    label: 'Closer look',
    shape: 'diamond',
    meaning: 'A threshold was passed; the assessor checks the figures before sign-off.',
  },
  3: {
    level: 3,
    label: 'Full review',
    shape: 'triangle',
    meaning: 'Screening thresholds were reached; a full review (and any statutory screening) is needed.',
  },
  4: {
    level: 4,
    label: 'Barred unless cleared',
    shape: 'barred-square',
    meaning: 'A hard gate fired: the conversion is not allowed unless the authority clears the legal bar.',
  },
};

export const RISK_LEVELS: readonly RiskLevel[] = [1, 2, 3, 4];

/** Label and shape of a level (a number outside 1-4 is an error, never guessed). */
export function levelInfo(level: number): LevelInfo {
  const info = LEVELS[level as RiskLevel];
  if (!info) throw new RangeError(`Risk level ${level} does not exist; levels run from 1 to 4.`);
  return info;
}
