/**
 * The screening map: every permanent-grassland parcel's level and CO2e if it were converted to
 * full-tillage cropland, under the authority's default factor set and rule set. Recomputed in the
 * same transaction as the publication of a factor set, rule set or reference layer (so every
 * instance sees one consistent map), and on request.
 */
import { recordAudit } from '../db/audit';
import { db, withTransaction, type Db } from '../db/client';
import { getGisSettings } from '../db/gis-settings';
import { bumpMapVersion, mapVersion } from '../db/parcels';
import { getProposalSettings } from '../db/proposals';
import { currentVersions } from '../db/reference-layers';
import { regionStatsWithReference } from '../db/regions';
import { committedCo2e } from '../db/register';
import * as store from '../db/screening';
import { deriveLandUseFlags, type LandUseEvent } from '../gis/land-use-history';
import { COVER_EPSILON } from '../gis/overlay-summary';
import type { Caller } from '../http/handle';
import type { Phases } from '../http/server-timing';
import { screenParcels, type ScreeningParcel } from '../proposals/screening';
import { holdingWindowYears } from '../rules';
import { regionFacts } from '../rules/region-facts';
import { defaultSetId, loadPublished } from './factor-sets';
import { loadRuleSet } from './rule-sets';

const SEED = 1;
const today = () => new Date().toISOString().slice(0, 10);

function normalised(classes: { class: string; share: number }[]): { type: string; fraction: number }[] {
  const total = classes.reduce((s, c) => s + c.share, 0);
  const out = classes.map((c) => ({ type: c.class, fraction: c.share / total }));
  if (out.length) out[out.length - 1]!.fraction = 1 - out.slice(0, -1).reduce((s, x) => s + x.fraction, 0);
  return out;
}

/** Recomputes the whole map inside `trx`. Returns the number of parcels screened and the time taken. */
export async function recomputeScreening(
  trx: Db,
  by: string | null,
  reason: string,
  phases?: Phases,
): Promise<{ screened: number; ms: number }> {
  const t0 = performance.now();
  const [settings, gis] = [await getProposalSettings(trx), await getGisSettings(trx)];
  const set = await loadPublished(trx, await defaultSetId(trx));
  const rules = await loadRuleSet(trx);
  phases?.mark('sets');
  const rows = await store.screeningInputs(trx);
  phases?.mark('inputs');
  const events = new Map<number, LandUseEvent[]>();
  for (const e of await store.allEvents(trx))
    events.set(e.parcel_id, [
      ...(events.get(e.parcel_id) ?? []),
      { date: e.date, kind: e.kind, value: e.value, cultivation: e.cultivation },
    ]);
  phases?.mark('events');
  const flagOptions = {
    asOf: today(),
    permanentGrasslandYears: gis['land-use.permanent-grassland-years'],
    uncultivatedYears: gis['land-use.uncultivated-years'],
    tillageEndsGrassland: gis['land-use.tillage-ends-grassland'],
  };
  const parcels: ScreeningParcel[] = [];
  for (const r of rows) {
    const flags = deriveLandUseFlags(events.get(r.id) ?? [], flagOptions);
    if (flags.permanentGrassland.value !== true) continue;
    const covered = (share: number | null) => share !== null && share >= 1 - COVER_EPSILON;
    const area = (share: number) => ({ share, areaHa: share * r.area_ha });
    parcels.push({
      parcelId: r.id,
      reference: r.reference,
      areaHa: r.area_ha,
      ownerRef: r.owner_ref,
      regionKey: r.region,
      climate: covered(r.climate_cover) ? r.climate : null,
      soils: covered(r.soil_cover) ? normalised(r.soils) : [],
      sensitive: area(r.sensitive),
      neverTilledLayer: area(r.never_tilled),
      slope: Object.fromEntries(r.slope.map((s) => [s.class, area(s.share)])),
      flags: { permanentGrassland: true, uncultivated: flags.uncultivated.value, neverTilled: flags.neverTilled.value },
    });
  }
  phases?.mark('flags');
  const keys = [...new Set(parcels.map((p) => p.regionKey).filter((k): k is string => !!k))];
  const regions = new Map<string, (ha: number) => ReturnType<typeof regionFacts>>();
  const { stats, refs } = keys.length
    ? await regionStatsWithReference(trx, today(), keys)
    : { stats: [], refs: new Map() };
  for (const s of stats) {
    const ref = refs.get(s.key);
    regions.set(s.key, (ha) => regionFacts(s, ref ? { ratio: ref.ratio, referenceYear: ref.referenceYear } : null, ha));
  }
  const windowYears = holdingWindowYears(rules.document) ?? 5;
  const earlierOnHolding = new Map(
    (await store.proposalsByHolding(trx, windowYears)).map((h) => [h.owner_ref, { ha: h.ha, references: h.refs }]),
  );
  const year = new Date().getUTCFullYear();
  const committedT = await committedCo2e(trx, year);
  phases?.mark('regions');
  const results = screenParcels(parcels, {
    set,
    gwp: settings['assessment.gwp'],
    runs: settings['assessment.runs'],
    seed: SEED,
    rules,
    regions,
    earlierOnHolding,
    windowYears,
    // Committed: the CO2e of approvals in the register for proposals starting this year.
    budget: { year, budgetT: settings['budget.yearly-co2e-t'], committedT },
  });
  phases?.mark('screen');
  const layers = Object.fromEntries((await currentVersions(trx)).map((v) => [v.kind, v.version]));
  const ms = Math.round(performance.now() - t0);
  const mapV = await bumpMapVersion(trx);
  const runId = await store.insertRun(trx, {
    factorSet: { id: set.id, version: set.version },
    ruleSet: rules.ref,
    layers,
    mapVersion: mapV,
    screened: results.length,
    ms,
    reason,
    by,
  });
  await store.replaceResults(trx, runId, results);
  phases?.mark('store');
  await recordAudit(trx, {
    actorId: by,
    action: 'screening.recompute',
    entityType: 'screening',
    entityId: String(runId),
    details: {
      reason,
      screened: results.length,
      factorSet: `${set.id}@${set.version}`,
      ruleSet: `${rules.ref.id}@${rules.ref.version}`,
    },
  });
  return { screened: results.length, ms };
}

export async function recomputeOnRequest(by: Caller, phases?: Phases) {
  return withTransaction(db, async (trx) => {
    await trx.raw('select pg_advisory_xact_lock(hashtext(?))', ['screening']);
    phases?.mark('lock');
    return recomputeScreening(trx, by.id, 'Recomputed on request', phases);
  });
}

export async function screeningTable(q: Parameters<typeof store.listResults>[1]) {
  const [run, list, version] = [await store.latestRun(db), await store.listResults(db, q), await mapVersion(db)];
  return {
    run: run
      ? {
          computedAt: new Date(run.computed_at).toISOString(),
          by: run.by_name ?? null,
          reason: run.reason,
          factorSet: `${run.factor_set_id}@${run.factor_set_version}`,
          ruleSet: `${run.rule_set_id}@${run.rule_set_version}`,
          layers: run.layer_versions,
          parcelsScreened: run.parcels_screened,
          durationMs: run.duration_ms,
          parcelsChangedSince: Number(run.map_data_version) < version,
        }
      : null,
    items: list.rows.map(
      (r: {
        parcel_id: number;
        reference: string;
        area_ha: number;
        level: number | null;
        label: string | null;
        co2e_total: number | null;
        co2e_high: number | null;
        soc_loss_per_ha: number | null;
        rules: string[];
        problem: string | null;
      }) => ({
        parcelId: r.parcel_id,
        reference: r.reference,
        areaHa: r.area_ha,
        level: r.level,
        label: r.label,
        co2eTotal: r.co2e_total,
        co2eHigh: r.co2e_high,
        socLossPerHa: r.soc_loss_per_ha,
        rules: r.rules,
        problem: r.problem,
      }),
    ),
    total: list.total,
    page: q.page,
    pageSize: q.pageSize,
  };
}
