/**
 * A risk level as a shape and its name (inline SVG + text). The shape and the words carry the
 * level; the colour only repeats it, so the badge reads the same in greyscale and to a screen
 * reader ("Risk level 3 of 4: Full review").
 */
import { levelInfo, type LevelShape, type RiskLevel } from '~/lib/rules/levels';

const SHAPES: Record<LevelShape, React.ReactNode> = {
  ring: <circle cx="8" cy="8" r="5.5" fill="none" stroke="currentColor" strokeWidth="2" />,
  diamond: (
    <path
      d="M8 1.5 L14.5 8 L8 14.5 L1.5 8 Z"
      fill="none"
      stroke="currentColor"
      strokeWidth="2"
      strokeLinejoin="round"
    />
  ),
  triangle: (
    <path
      d="M8 1.8 L14.8 14 L1.2 14 Z"
      fill="currentColor"
      stroke="currentColor"
      strokeWidth="1.2"
      strokeLinejoin="round"
    />
  ),
  'barred-square': (
    <>
      <rect x="1.5" y="1.5" width="13" height="13" rx="1.5" fill="currentColor" />
      <path d="M4 8 H12" stroke="white" strokeWidth="2.4" strokeLinecap="round" />
    </>
  ),
};

const TONE: Record<RiskLevel, string> = {
  1: 'text-sward-700 border-sward-600 bg-sward-50',
  2: 'text-sky-700 border-sky-700 bg-white',
  3: 'text-peat-600 border-peat-600 bg-clay-50',
  4: 'text-clay-700 border-clay-700 bg-clay-50',
};

export function RiskShape({ level, size = 16 }: { level: RiskLevel; size?: number }) {
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 16 16"
      aria-hidden="true"
      focusable="false"
      className="shrink-0"
      data-shape={levelInfo(level).shape}
    >
      {SHAPES[levelInfo(level).shape]}
    </svg>
  );
}

export function RiskBadge({ level, compact = false }: { level: RiskLevel; compact?: boolean }) {
  const info = levelInfo(level);
  return (
    <span
      className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded border px-2 py-0.5 text-sm font-medium ${TONE[level]}`}
      role="img"
      aria-label={`Risk level ${level} of 4: ${info.label}`}
      title={info.meaning}
    >
      <RiskShape level={level} />
      <span aria-hidden="true">{compact ? level : `${level} · ${info.label}`}</span>
    </span>
  );
}
