/** Multipart uploads to the running test server, and counting what the upload routes write. */
import { BASE_URL } from './env';
import { testDb } from './db';
import type { Session } from './http';

export async function uploadFile(
  session: Session,
  fileName: string,
  bytes: Uint8Array | string,
  purpose = 'parcels',
): Promise<{ status: number; body: any }> {
  const form = new FormData();
  form.set('purpose', purpose);
  form.set('file', new Blob([bytes as BlobPart]), fileName);
  const res = await fetch(`${BASE_URL}/api/uploads`, {
    method: 'POST',
    headers: { cookie: session.cookie, origin: BASE_URL },
    body: form,
  });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null };
}

/** Rows in every table an upload can write to (plus upload audit events). */
export async function uploadRowCounts(): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of [
    'upload_staging',
    'upload_staging_feature',
    'upload_batch',
    'parcel',
    'land_use_event',
    'reference_layer_version',
    'column_mapping',
  ]) {
    out[t] = Number((await testDb(t).count('* as n').first())?.n ?? 0);
  }
  out.uploadAudit = Number(
    (await testDb('audit_event').where('action', 'like', 'upload.%').count('* as n').first())?.n ?? 0,
  );
  return out;
}

export async function withSetting<T>(key: string, value: unknown, fn: () => Promise<T>): Promise<T> {
  await testDb('app_setting')
    .insert({ key, value: JSON.stringify(value) })
    .onConflict('key')
    .merge();
  try {
    return await fn();
  } finally {
    await testDb('app_setting').where({ key }).delete();
  }
}
