/** Writes one authority setting for the demo (audited like an admin's change). */
import { recordAudit } from '../../src/lib/db/audit';
import { db } from '../../src/lib/db/client';

export async function putSettingValue(key: string, value: unknown): Promise<void> {
  await db.transaction(async (trx) => {
    await trx('app_setting')
      .insert({ key, value: JSON.stringify(value) })
      .onConflict('key')
      .merge();
    await recordAudit(trx, {
      actorId: null,
      action: 'setting.seed',
      entityType: 'setting',
      entityId: key,
      details: { value },
    });
  });
}
