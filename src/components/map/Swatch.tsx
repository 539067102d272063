/** A legend swatch drawn as SVG with the same pattern as the map fill. */
import type { Pattern } from '~/lib/gis/reference-kinds';
import { hexToRgba } from './patterns';

export function Swatch({
  colour,
  pattern,
  id,
  dashed = false,
}: {
  colour: string;
  pattern: Pattern | 'outline';
  id: string;
  dashed?: boolean;
}) {
  const stroke = hexToRgba(colour, 0.9);
  const marks: Record<Pattern, React.ReactNode> = {
    hatch: <path d="M0 10 L10 0" stroke={stroke} strokeWidth="1.4" />,
    backslash: <path d="M0 0 L10 10" stroke={stroke} strokeWidth="1.4" />,
    cross: <path d="M0 10 L10 0 M0 0 L10 10" stroke={stroke} strokeWidth="1.2" />,
    vertical: <path d="M5 0 L5 10" stroke={stroke} strokeWidth="1.4" />,
    horizontal: <path d="M0 5 L10 5" stroke={stroke} strokeWidth="1.4" />,
    dots: <circle cx="5" cy="5" r="1.8" fill={stroke} />,
    solid: <rect width="10" height="10" fill={hexToRgba(colour, 0.28)} />,
    grid: <path d="M5 0 L5 10 M0 5 L10 5" stroke={stroke} strokeWidth="1.2" />,
    rings: <circle cx="5" cy="5" r="2.6" fill="none" stroke={stroke} strokeWidth="1.2" />,
    checker: <path d="M0 0 H5 V5 H0 Z M5 5 H10 V10 H5 Z" fill={hexToRgba(colour, 0.55)} />,
  };
  if (pattern === 'outline') {
    return (
      <svg width="22" height="16" aria-hidden="true" className="shrink-0">
        <rect x="1" y="1" width="20" height="14" fill="none" stroke={colour} strokeWidth="1.5" />
      </svg>
    );
  }
  return (
    <svg width="22" height="16" aria-hidden="true" className="shrink-0">
      <defs>
        <pattern id={id} width="10" height="10" patternUnits="userSpaceOnUse">
          <rect width="10" height="10" fill={hexToRgba(colour, 0.16)} />
          {marks[pattern]}
        </pattern>
      </defs>
      <rect
        x="1"
        y="1"
        width="20"
        height="14"
        fill={`url(#${id})`}
        stroke={stroke}
        strokeWidth={dashed ? 2 : 1.2}
        strokeDasharray={dashed ? '4 2' : undefined}
      />
    </svg>
  );
}
