/** Labels of the parcel fields an upload maps (pure, no zod: the upload wizard imports it). */
import type { ParcelMapping } from './field-mapping';

/** Fields a parcel mapping can fill, with their labels for the wizard. */
export const PARCEL_FIELD_LABELS: Record<
  Exclude<keyof ParcelMapping, 'statedAreaUnit' | 'grassSinceDate' | 'lastTillageDate'>,
  string
> = {
  reference: 'Parcel reference',
  name: 'Field name',
  landUse: 'Current land use',
  management: 'Current management',
  lastTillage: 'Last tillage date',
  lastReseeding: 'Last reseeding date',
  grassSince: 'In grass since (date)',
  ownerRef: 'Owner or holding reference (private)',
  statedArea: 'Stated area',
};
