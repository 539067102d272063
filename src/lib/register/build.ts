/** Builds a register entry's content from a proposal, its signed assessment and the decision (pure). */
import { round, type Condition, type Outcome, type RegisterContent } from './content';

export type DecisionFacts = {
  proposal: {
    reference: string;
    title: string;
    proposed: { landUse: string; [k: string]: unknown };
    startYear: number;
  };
  parcels: {
    reference: string;
    areaHa: number;
    part: boolean;
    geometry: { type: 'MultiPolygon'; coordinates: number[][][][] };
  }[];
  assessment: {
    number: number;
    totals: { co2eTotal: number; co2eLow: number; co2eHigh: number; socChangeTotal: number; runs: number };
    grade: { level: number; label: string };
    factorSet: { id: string; version: number };
    ruleSet: { id: string; version: number } | null;
    gwp: string;
    regionAreas: { key: string; areaHa: number }[];
  };
  meeting: { date: string; place: string } | null;
  votes: RegisterContent['votes'];
  outcome: Outcome;
  reasons: string;
  conditions: Condition[];
  appealUntil: string | null;
  effectiveDate: string;
  decidedOn: string;
  recordedAt: string;
  /** An approval whose assessment named a compensation parcel: what is credited for it. */
  compensation?: RegisterContent['compensation'];
};

/** Twice the signed area of a ring in lon/lat (shoelace): positive when counter-clockwise. */
const signedArea = (ring: number[][]) =>
  ring.reduce((s, p, i) => {
    const q = ring[(i + 1) % ring.length]!;
    return s + p[0]! * q[1]! - q[0]! * p[1]!;
  }, 0);

/** Coordinates to 7 decimals (about 1 cm) and rings wound as RFC 7946 section 3.1.6 asks: exterior counter-clockwise, holes clockwise. */
const roundCoords = (g: DecisionFacts['parcels'][number]['geometry']) => ({
  type: 'MultiPolygon' as const,
  coordinates: g.coordinates.map((poly) =>
    poly.map((ring, i) => {
      const r = ring.map((pos) => pos.slice(0, 2).map((c) => round(c, 7)));
      return signedArea(r) > 0 === (i === 0) ? r : r.reverse();
    }),
  ),
});

export function proposedUse(p: { landUse: string; [k: string]: unknown }): string {
  return [
    p.landUse,
    ...['system', 'tillage', 'management', 'input'].map((k) => p[k]).filter((v): v is string => typeof v === 'string'),
  ].join(', ');
}

/** The region holding most of the area (ties: the first key in alphabetical order). */
function mainRegion(areas: { key: string; areaHa: number }[]): string | null {
  const sums = new Map<string, number>();
  for (const a of areas) sums.set(a.key, (sums.get(a.key) ?? 0) + a.areaHa);
  return [...sums.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))[0]?.[0] ?? null;
}

export function decisionContent(f: DecisionFacts): RegisterContent {
  const t = f.assessment.totals;
  return {
    kind: 'decision',
    proposal: {
      reference: f.proposal.reference,
      title: f.proposal.title,
      proposedUse: proposedUse(f.proposal.proposed),
      startYear: f.proposal.startYear,
    },
    parcels: f.parcels.map((p) => ({
      reference: p.reference,
      areaHa: round(p.areaHa, 4),
      part: p.part,
      geometry: roundCoords(p.geometry),
    })),
    areaHa: round(
      f.parcels.reduce((s, p) => s + p.areaHa, 0),
      4,
    ),
    region: mainRegion(f.assessment.regionAreas),
    outcome: f.outcome,
    reasons: f.reasons,
    conditions: f.conditions,
    figures: {
      co2eTotal: round(t.co2eTotal),
      co2eLow: round(t.co2eLow),
      co2eHigh: round(t.co2eHigh),
      socChangeTotal: round(t.socChangeTotal),
      runs: t.runs,
      gwp: f.assessment.gwp,
      unit: 't CO2e',
    },
    risk: { level: f.assessment.grade.level, label: f.assessment.grade.label },
    factorSet: f.assessment.factorSet,
    ruleSet: f.assessment.ruleSet,
    assessment: { number: f.assessment.number },
    meeting: f.meeting,
    votes: f.votes,
    appealUntil: f.appealUntil,
    effectiveDate: f.effectiveDate,
    decidedOn: f.decidedOn,
    recordedAt: f.recordedAt,
    supersedes: null,
    note: null,
    // Only when there is one: older entries have no such key, and their hashes must not change.
    ...(f.compensation
      ? {
          compensation: {
            ...f.compensation,
            areaHa: round(f.compensation.areaHa, 4),
            creditedCo2e: round(f.compensation.creditedCo2e),
          },
        }
      : {}),
  };
}

export type ReversalFacts = {
  credited: { seq: number; content: RegisterContent };
  parcel: DecisionFacts['parcels'][number];
  creditedCo2e: number;
  creditedSocT: number;
  permanenceUntil: string;
  event: { date: string; what: string };
  recordedAt: string;
};

/**
 * The entry that takes back a compensation's credited gain when its parcel is ploughed within the
 * permanence period (pure). It names the crediting entry in `reverses` (not `supersedes`: the
 * approval itself stands), carries the parcel, and its figures are the gain now counted as emissions.
 */
export function reversalContent(f: ReversalFacts): RegisterContent {
  const c = f.credited.content;
  const gain = round(f.creditedCo2e);
  return {
    kind: 'compensation-reversed',
    proposal: c.proposal,
    parcels: [
      {
        reference: f.parcel.reference,
        areaHa: round(f.parcel.areaHa, 4),
        part: false,
        geometry: roundCoords(f.parcel.geometry),
      },
    ],
    areaHa: round(f.parcel.areaHa, 4),
    region: c.region,
    outcome: c.outcome,
    reasons:
      `Parcel ${f.parcel.reference} was credited as compensation in entry ${f.credited.seq} and had to stay ` +
      `in grass until ${f.permanenceUntil}; the land-use record shows ${f.event.what} on ${f.event.date}.`,
    conditions: [],
    figures: {
      co2eTotal: gain,
      co2eLow: gain,
      co2eHigh: gain,
      socChangeTotal: -round(f.creditedSocT),
      runs: 0,
      gwp: c.figures.gwp,
      unit: 't CO2e',
    },
    risk: c.risk,
    factorSet: c.factorSet,
    ruleSet: c.ruleSet,
    assessment: c.assessment,
    meeting: null,
    votes: null,
    appealUntil: null,
    effectiveDate: f.event.date,
    decidedOn: f.recordedAt.slice(0, 10),
    recordedAt: f.recordedAt,
    supersedes: null,
    note:
      `The compensation credited in entry ${f.credited.seq} is reversed: ${gain} t CO2e count again in the ` +
      `committed emissions of ${f.event.date.slice(0, 4)}.`,
    reverses: {
      seq: f.credited.seq,
      parcelReference: f.parcel.reference,
      creditedCo2e: gain,
      eventDate: f.event.date,
      permanenceUntil: f.permanenceUntil,
      budgetYear: Number(f.event.date.slice(0, 4)),
    },
  };
}
