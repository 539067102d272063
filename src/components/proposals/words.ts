/** Plain words for proposals on screens (pure: pages and islands import it). */
import { formatDate, formatDateTime } from '~/lib/format/dates';
import type { LandUseState } from '~/lib/carbon';
import { STATE_LABELS, type ProposalState } from '~/lib/proposals/states';
import {
  CROP_INPUT_LABELS,
  GRASS_INPUT_LABELS,
  MANAGEMENT_LABELS,
  SYSTEM_LABELS,
  TILLAGE_LABELS,
} from '../calculator/labels';

export const INTEREST_LABELS: Record<'owner' | 'tenant' | 'agent', string> = {
  owner: 'Owner',
  tenant: 'Tenant',
  agent: 'Agent for the owner or tenant',
};

/** The engine's state in words, e.g. "Cropland: long-term cultivated (annual crops), full tillage, medium input". */
export function describeUse(s: LandUseState): string {
  if (s.landUse === 'grassland')
    return `Grassland: ${MANAGEMENT_LABELS[s.management].toLowerCase()}, ${GRASS_INPUT_LABELS[s.input].toLowerCase()} input`;
  return `Cropland: ${SYSTEM_LABELS[s.system].toLowerCase()}, ${TILLAGE_LABELS[s.tillage].toLowerCase()}, ${CROP_INPUT_LABELS[s.input].toLowerCase()} input`;
}

export function stateLabel(s: string): string {
  return STATE_LABELS[s as ProposalState] ?? s;
}

/** The statutory clock in words; overdue is said, never only coloured. */
export function clockWords(decisionDue: string | null, daysLeft: number | null): { text: string; overdue: boolean } {
  if (!decisionDue) return { text: 'Clock not started (starts when submitted)', overdue: false };
  if (daysLeft === null) return { text: `Decision was due ${formatDate(decisionDue)}`, overdue: false };
  if (daysLeft < 0)
    return {
      text: `Overdue by ${-daysLeft} day${daysLeft === -1 ? '' : 's'} (due ${formatDate(decisionDue)})`,
      overdue: true,
    };
  if (daysLeft === 0) return { text: `Due today (${formatDate(decisionDue)})`, overdue: false };
  return { text: `${daysLeft} day${daysLeft === 1 ? '' : 's'} left (due ${formatDate(decisionDue)})`, overdue: false };
}

export const tonnes = (x: number | null | undefined, digits = 1) =>
  x === null || x === undefined
    ? '—'
    : `${x.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits })} t CO2e`;
export const hectares = (x: number, digits = 2) =>
  `${x.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits })} ha`;
export const when = (iso: string | null) => formatDateTime(iso);
export const bytes = (n: number) =>
  n >= 1_048_576 ? `${(n / 1_048_576).toFixed(1)} MB` : n >= 1024 ? `${Math.round(n / 1024)} kB` : `${n} bytes`;
