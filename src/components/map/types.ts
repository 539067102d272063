/** Shapes of the map API answers, as the map island reads them. */
import type { Pattern } from '~/lib/gis/reference-kinds';

export type LegendKind = {
  kind: string;
  label: string;
  version: number | null;
  classes: Record<string, { label: string; colour: string; pattern: Pattern }>;
};
export type MapConfig = {
  dataVersion: number;
  tileToken: string;
  areas: { id: string | null; label: string; count: number; extent: [number, number, number, number] }[];
  legend: LegendKind[];
  basemapUrl: string | null;
  parcelMinZoom: number;
};
export type Flag = { value: boolean | null; reason: string };
export type KindSummary = {
  kind: string;
  layerVersion: number | null;
  classes: { class: string; areaHa: number; share: number }[];
  dominant: string | null;
  uncoveredShare: number;
  flag: string | null;
};
export type ParcelDetail = {
  id: number;
  reference: string;
  name: string | null;
  areaHa: number;
  statedAreaHa: number | null;
  landUse: string | null;
  management: string | null;
  ownerRef: string | null;
  geometry: GeoJSON.MultiPolygon;
  version: number;
  source: { kind: 'upload' | 'drawn'; fileName: string | null; savedAt: string | null };
  flags: { asOf: string; permanentGrassland: Flag; uncultivated: Flag; neverTilled: Flag };
  overlay: Record<string, KindSummary>;
  history: {
    id: number;
    date: string;
    kind: string;
    value: string | null;
    cultivation: boolean;
    evidence: string;
    recordedBy: string | null;
    recordedAt: string;
  }[];
  proposals: { id: string; title: string; status: string }[];
};
