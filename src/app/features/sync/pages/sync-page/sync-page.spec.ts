import 'fake-indexeddb/auto';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { deserialize, serialize } from 'node:v8';
import type { ConflictView } from '../../../../../../shared/sync/protocol';
import { AuthSession, type SessionUser } from '../../../../core/auth/auth-session';
import { heapsightDb } from '../../../../core/db/heapsight-db';
import type { SyncProgress } from '../../../../core/sync/sync-engine';
import { SyncService } from '../../../../core/sync/sync.service';
import { AppLanguage } from '../../../../i18n/app-language';
import SyncPage from './sync-page';

// jsdom has no structuredClone, which fake-indexeddb uses to store values; Node's serializer is the same algorithm.
globalThis.structuredClone ??= <T>(value: T): T => deserialize(serialize(value)) as T;

const geologist: SessionUser = {
  id: 'g1', organizationId: 'o', email: 'neema@crew.test', name: 'Neema', role: 'geologist', labName: null,
  siteIds: ['s1'], sites: [{ id: 's1', code: 'JR', name: 'Jackal Ridge' }], deviceId: 'd1', deviceName: 'Desk',
};

const conflict: ConflictView = {
  id: 'c1', entity: 'pile', recordId: 'p1', siteId: 's1', deviceId: 'phone-3', baseRevision: 4, serverRevision: 6, deviceOp: 'upsert',
  deviceData: { code: 'JR-03-P0007', heightM: 3 }, serverData: { code: 'JR-03-P0007', heightM: 2.5 }, status: 'open', createdAt: '2026-03-02T09:30:00.000Z',
};

const sending: SyncProgress = {
  status: 'pushing', mutationsSent: 3, mutationsTotal: 12, photosSent: 1, photosTotal: 4, bytesSent: 1_536_000, bytesTotal: 3_072_000,
  changesPulled: 0, error: null,
};

/** A stand-in for the sync service: its signals are what the page reads. */
function fakeSync() {
  return {
    progress: signal<SyncProgress | null>(sending), lastSyncAt: signal<string | null>(null), queueSize: signal(2), rejectedCount: signal(0),
    syncNow: jest.fn(),
  };
}

async function render() {
  const db = heapsightDb();
  await db.open();
  await db.conflicts.clear();
  await db.outbox.clear();
  TestBed.configureTestingModule({
    imports: [SyncPage],
    providers: [provideHttpClient(), provideHttpClientTesting(), { provide: SyncService, useValue: fakeSync() }],
  });
  TestBed.inject(AuthSession).signIn(geologist, { accessToken: 'a', refreshToken: 'r' });
  const fixture = TestBed.createComponent(SyncPage);
  fixture.autoDetectChanges();
  const server = TestBed.inject(HttpTestingController);
  for (const request of server.match('/api/sync/conflicts?status=open')) request.flush({ items: [conflict] });
  // Dexie's live queries answer in later tasks; one macrotask turn lets them run.
  await new Promise((resolve) => setTimeout(resolve, 50));
  await fixture.whenStable();
  return { fixture, element: fixture.nativeElement as HTMLElement, server };
}

async function speak(fixture: Awaited<ReturnType<typeof render>>['fixture'], code: 'sw' | 'fr') {
  await TestBed.inject(AppLanguage).use(code);
  fixture.detectChanges();
  await fixture.whenStable();
}

describe('SyncPage', () => {
  afterEach(() => localStorage.clear());

  it('shows the queue, the progress and the conflict to settle in English', async () => {
    const { element } = await render();
    expect(element.querySelector('[role=status]')?.textContent).toContain('2 changes waiting · last sync never');
    expect(element.textContent).toContain('Sending changes · 3/12 changes · 1/4 photos (1,500 of 3,000 kB)');
    expect(element.querySelector('article.conflict')?.getAttribute('aria-label')).toBe('Conflict on Pile JR-03-P0007');
    expect(element.textContent).toContain('Keep device');
  });

  it('follows a switch to Kiswahili and to French, numbers in French with French separators', async () => {
    const { fixture, element } = await render();

    await speak(fixture, 'sw');
    expect(element.querySelector('[role=status]')?.textContent).toContain('Mabadiliko 2 yanasubiri');
    expect(element.querySelector('h1')?.textContent).toBe('Sawazisha');
    expect(element.querySelector('article.conflict')?.getAttribute('aria-label')).toBe('Mgongano kwenye Rundo JR-03-P0007');
    expect(element.textContent).toContain('Chagua toleo la kifaa');

    await speak(fixture, 'fr');
    expect(element.querySelector('[role=status]')?.textContent).toContain('2 modifications en attente · dernière synchronisation : jamais');
    expect(element.querySelector('article.conflict h3')?.textContent).toContain('Tas JR-03-P0007');
    // CLDR French groups thousands with a narrow no-break space.
    expect(element.textContent).toContain('(1\u202f500 sur 3\u202f000 kB)');
    expect(element.textContent).not.toContain('changes waiting');
  });

  it('explains a refused resolution in the reader’s language', async () => {
    const { fixture, element, server } = await render();
    await speak(fixture, 'fr');
    (element.querySelector('.choices button') as HTMLButtonElement).click();
    server.expectOne('/api/sync/conflicts/c1/resolve').flush(
      { error: { code: 'conflict', message: 'This conflict is already resolved', details: null } }, { status: 409, statusText: 'Conflict' },
    );
    await new Promise((resolve) => setTimeout(resolve, 0));
    await fixture.whenStable();
    expect(element.querySelector('[role=alert].error')?.textContent).toBe('Ce conflit est déjà réglé.');
  });
});
