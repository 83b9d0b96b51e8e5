/** What a human code is made of: the site's code, the device's number and its sequence. */
export interface HumanCodeParts {
  readonly siteCode: string;
  /** The short number the server gave this device (`POST /api/sync/device`), unique per deployment. */
  readonly deviceNumber: number;
  /** The device's running number for this kind of record at this site, from 1. */
  readonly sequence: number;
  readonly kind: 'sample' | 'pile';
}

/**
 * Makes a human code `SITE-DEVICE-SEQ`, e.g. `JR-07-0042` for a sample and `JR-07-P0042` for a
 * pile. Because the device number is unique per deployment and each device counts its own
 * sequence, two devices can never make the same code, even offline for weeks.
 */
export function makeHumanCode(parts: HumanCodeParts): string {
  const { siteCode, deviceNumber, sequence, kind } = parts;
  if (!/^[A-Z0-9]{1,8}$/.test(siteCode)) {
    throw new RangeError(`site code must be 1-8 capital letters or digits, got "${siteCode}"`);
  }
  if (!Number.isInteger(deviceNumber) || deviceNumber < 1 || deviceNumber > 9999) {
    throw new RangeError(`device number must be 1-9999, got ${deviceNumber}`);
  }
  if (!Number.isInteger(sequence) || sequence < 1 || sequence > 999_999) {
    throw new RangeError(`sequence must be 1-999999, got ${sequence}`);
  }
  const device = String(deviceNumber).padStart(2, '0');
  const running = String(sequence).padStart(4, '0');
  return `${siteCode}-${device}-${kind === 'pile' ? 'P' : ''}${running}`;
}

/** Reads a human code back into its parts, or null when it is not one. */
export function parseHumanCode(code: string): HumanCodeParts | null {
  const match = /^([A-Z0-9]{1,8})-(\d{2,4})-(P?)(\d{4,6})$/.exec(code);
  if (!match) {
    return null;
  }
  return { siteCode: match[1], deviceNumber: Number(match[2]), sequence: Number(match[4]), kind: match[3] === 'P' ? 'pile' : 'sample' };
}
