import type { Transaction } from 'sequelize';
import { Device } from './device.model';

/** Notes that a device finished a sync; the sync component calls this inside its own transaction. */
export async function markDeviceSynced(deviceId: string, at: Date, transaction: Transaction): Promise<void> {
  await Device.update({ lastSyncAt: at, lastSeenAt: at }, { where: { id: deviceId }, transaction });
}
