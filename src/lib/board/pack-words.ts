/** The board pack in plain words, shared by the meeting page and the PDF (pure). */
import { formatDate } from '~/lib/format/dates';
import { CLIMATE_LABELS, SOIL_LABELS } from '~/components/calculator/labels';
import { describeUse } from '~/components/proposals/words';
import type { ClimateRegion, LandUseState, SoilType } from '../carbon';

type Clock = { decisionDue: string | null; daysLeft: number | null; state: 'overdue' | 'near' | 'running' | 'stopped' };

const fmt = (x: number, dp = 0) => x.toLocaleString('en-GB', { minimumFractionDigits: dp, maximumFractionDigits: dp });
export const ha = (x: number) => `${fmt(x, 2)} ha`;
export const t = (x: number | null) => (x === null ? '—' : `${fmt(x, 1)} t CO2e`);
export const pct = (x: number | null, dp = 1) => (x === null ? '—' : `${fmt(x * 100, dp)} %`);

/** The statutory clock: overdue and near are said in words, never only marked. */
export function clockText(c: Clock): string {
  if (!c.decisionDue) return 'No statutory clock (not submitted)';
  if (c.daysLeft === null) return `Decision was due ${formatDate(c.decisionDue)} (clock stopped)`;
  if (c.state === 'overdue')
    return `Overdue by ${-c.daysLeft} day${c.daysLeft === -1 ? '' : 's'}: the decision was due ${formatDate(c.decisionDue)}`;
  const left = c.daysLeft === 0 ? 'Due today' : `${c.daysLeft} day${c.daysLeft === 1 ? '' : 's'} left`;
  return `${c.state === 'near' ? 'Deadline near: ' : ''}${left} (decision due ${formatDate(c.decisionDue)})`;
}

export const useText = (s: object | null) => (s ? describeUse(s as LandUseState) : 'Not recorded');
export const climateText = (c: string | null) => (c ? (CLIMATE_LABELS[c as ClimateRegion] ?? c) : 'not known');
export const soilText = (s: { type: string; fraction: number }[]) =>
  s.length
    ? s.map((x) => `${SOIL_LABELS[x.type as SoilType] ?? x.type} ${Math.round(x.fraction * 100)} %`).join('; ')
    : 'not known';
const yesNo = (b: boolean | null, yes: string, no: string) =>
  b === null ? 'history does not decide it' : b ? yes : no;

type PackParcel = {
  reference: string;
  areaHa: number;
  parcelAreaHa: number;
  part: boolean;
  currentState: object | null;
  stateSource: { source: string; note: string } | null;
  climate: string | null;
  soils: { type: string; fraction: number }[];
  permanentGrassland: boolean | null;
  neverTilled: boolean | null;
  sensitiveShare: number;
  co2eTotal: number | null;
};

/** One parcel's facts as label/value rows. */
export function parcelFacts(p: PackParcel): [string, string][] {
  return [
    ['Area', `${ha(p.areaHa)}${p.part ? ` (drawn part of ${ha(p.parcelAreaHa)})` : ''}`],
    [
      'Use now',
      `${useText(p.currentState)}${
        p.stateSource
          ? ` (${
              p.stateSource.source === 'assessor' ? 'chosen by the ' + 'assessor' : 'from the parcel record'
            }: ${p.stateSource.note})`
          : ''
      }`,
    ],
    ['Climate, soil', `${climateText(p.climate)}; ${soilText(p.soils)}`],
    ['Permanent grassland', yesNo(p.permanentGrassland, 'yes, by its recorded history', 'no')],
    ['Never tilled', yesNo(p.neverTilled, 'yes', 'no')],
    ['Designated sensitive', p.sensitiveShare > 0 ? `${pct(p.sensitiveShare, 0)} of the parcel` : 'none'],
    ['Net emission', t(p.co2eTotal)],
  ];
}

type Region = {
  label: string;
  ratioNow: number | null;
  ratioAfter: number | null;
  referenceRatio: number | null;
  referenceYear: number | null;
  referenceSource: string | null;
  relativeFallAfter: number | null;
  convertedHa: number;
};

export function regionText(r: Region): string {
  const ref =
    r.referenceRatio === null
      ? 'no reference ratio recorded'
      : `reference ${pct(r.referenceRatio)} (${r.referenceYear}${r.referenceSource ? `; ${r.referenceSource}` : ''})`;
  const fall =
    r.relativeFallAfter === null
      ? ''
      : r.relativeFallAfter > 0
        ? `; ${pct(r.relativeFallAfter)} below the reference after approval`
        : '; still at or above the reference after approval';
  return (
    `${r.label}: permanent-grassland ratio ${pct(r.ratioNow)} now, ${pct(r.ratioAfter)} if approved ` +
    `(${ha(r.convertedHa)} of permanent grassland converted); ${ref}${fall}.`
  );
}

type Budget = {
  year: number;
  budgetT: number | null;
  committedT: number;
  proposalT: number;
  afterT: number;
  shareAfter: number | null;
  overBudget: boolean | null;
};

export function budgetText(b: Budget): string {
  if (b.budgetT === null)
    return (
      `Approvals for ${b.year} commit ${t(b.committedT)}; approving this adds ${t(b.proposalT)} ` +
      `(${t(b.afterT)} in all). The authority has set no yearly budget.`
    );
  return (
    `Approvals for ${b.year} commit ${t(b.committedT)} of the ${t(b.budgetT)} budget; approving this ` +
    `adds ${t(b.proposalT)}: ${t(b.afterT)}, ${pct(b.shareAfter)} of the budget${b.overBudget ? ' — OVER the budget' : ''}.`
  );
}
