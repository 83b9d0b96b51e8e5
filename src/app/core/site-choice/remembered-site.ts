/**
 * Which site a review screen opens on. Each screen remembers the site last chosen on this device
 * (localStorage, so it survives reloads and works offline); with nothing remembered, or when the
 * remembered site is no longer one of the user's, it opens on the first site that has data for
 * that screen, and on the first site when none has.
 */

/** The screens that remember a site; each keeps its own choice. */
export type SiteScreen = 'site-map' | 'qaqc' | 'calibration';

const keyOf = (screen: SiteScreen) => `heapsight.site.${screen}`;

/** The site last chosen on this screen on this device, or null. */
export function rememberedSiteId(screen: SiteScreen, storage: Pick<Storage, 'getItem'> = localStorage): string | null {
  try {
    return storage.getItem(keyOf(screen));
  } catch {
    // Storage can be switched off in the browser; the screen then simply forgets.
    return null;
  }
}

/** Remembers the site chosen on this screen on this device. */
export function rememberSiteId(screen: SiteScreen, siteId: string, storage: Pick<Storage, 'setItem'> = localStorage): void {
  try {
    storage.setItem(keyOf(screen), siteId);
  } catch {
    // See rememberedSiteId: forgetting is harmless.
  }
}

/** The site to open and what was loaded for it (null when the user has no site). */
export interface OpeningSite<T> {
  readonly siteId: string;
  /** The screen's data for that site, or null when loading failed (offline, refused). */
  readonly data: T | null;
}

/**
 * The remembered site if it is still the user's; else the first of `siteIds`, in order, whose data
 * `hasData` accepts; else the first site. Loads one site at a time and stops at the first with data,
 * so a user with one busy site costs one request.
 */
export async function openingSite<T>(
  siteIds: readonly string[],
  remembered: string | null,
  load: (siteId: string) => Promise<T>,
  hasData: (data: T) => boolean,
): Promise<OpeningSite<T> | null> {
  if (siteIds.length === 0) {
    return null;
  }
  const tryLoad = (siteId: string) => load(siteId).catch(() => null);
  if (remembered && siteIds.includes(remembered)) {
    return { siteId: remembered, data: await tryLoad(remembered) };
  }
  let first: OpeningSite<T> | null = null;
  for (const siteId of siteIds) {
    const data = await tryLoad(siteId);
    first ??= { siteId, data };
    if (data !== null && hasData(data)) {
      return { siteId, data };
    }
  }
  return first;
}
