/**
 * An upload in words for the map and the parcel panel: the file's name without its extension,
 * separators as spaces, first letter capital ("corrowmere_parcels-2026.zip" → "Corrowmere parcels 2026"),
 * with the day it was saved (pure).
 */
import { formatDate } from '../format/dates';

export function uploadName(fileName: string): string {
  const base = fileName.replace(/^.*[\\/]/, '').replace(/(\.(zip|geojson|json|shp))+$/i, '');
  const words =
    base
      .replace(/[_\-.]+/g, ' ')
      .replace(/\s+/g, ' ')
      .trim() || fileName;
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** "Corrowmere parcels 2026, uploaded 2 Dec 2026". */
export function uploadLabel(fileName: string, savedAt: string | Date | null): string {
  return savedAt ? `${uploadName(fileName)}, uploaded ${formatDate(savedAt)}` : uploadName(fileName);
}
