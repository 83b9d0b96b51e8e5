import { openingSite, rememberSiteId, rememberedSiteId } from './remembered-site';

function memoryStorage() {
  const values = new Map<string, string>();
  return { getItem: (key: string) => values.get(key) ?? null, setItem: (key: string, value: string) => void values.set(key, value) };
}

describe('rememberedSiteId', () => {
  it('gives back the site remembered for the same screen only', () => {
    const storage = memoryStorage();
    rememberSiteId('qaqc', 'site-b', storage);
    expect(rememberedSiteId('qaqc', storage)).toBe('site-b');
    expect(rememberedSiteId('calibration', storage)).toBeNull();
  });

  it('forgets quietly when storage refuses', () => {
    const refusing = { getItem: () => { throw new Error('denied'); }, setItem: () => { throw new Error('denied'); } };
    expect(() => rememberSiteId('site-map', 'a', refusing)).not.toThrow();
    expect(rememberedSiteId('site-map', refusing)).toBeNull();
  });
});

describe('openingSite', () => {
  const data: Record<string, number[]> = { a: [], b: [1, 2], c: [3] };
  const load = jest.fn(async (siteId: string) => data[siteId]);
  const hasData = (rows: number[]) => rows.length > 0;
  beforeEach(() => load.mockClear());

  it('opens on the remembered site when it is still one of the user\'s, loading only that one', async () => {
    await expect(openingSite(['a', 'b', 'c'], 'c', load, hasData)).resolves.toEqual({ siteId: 'c', data: [3] });
    expect(load).toHaveBeenCalledTimes(1);
  });

  it('with nothing remembered, opens on the first site that has data and stops there', async () => {
    await expect(openingSite(['a', 'b', 'c'], null, load, hasData)).resolves.toEqual({ siteId: 'b', data: [1, 2] });
    expect(load.mock.calls.map(([siteId]) => siteId)).toEqual(['a', 'b']);
  });

  it('ignores a remembered site the user no longer belongs to', async () => {
    await expect(openingSite(['a', 'b'], 'gone', load, hasData)).resolves.toEqual({ siteId: 'b', data: [1, 2] });
  });

  it('opens on the first site when no site has data, and skips sites that fail to load', async () => {
    const failing = jest.fn(async (siteId: string) => {
      if (siteId === 'a') throw new Error('offline');
      return [] as number[];
    });
    await expect(openingSite(['a', 'b'], null, failing, hasData)).resolves.toEqual({ siteId: 'a', data: null });
  });

  it('answers null for a user with no site', async () => {
    await expect(openingSite([], null, load, hasData)).resolves.toBeNull();
  });
});
