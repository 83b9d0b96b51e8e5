import 'fake-indexeddb/auto';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { deserialize, serialize } from 'node:v8';
import { eventually } from '../../../testing/eventually';
import { AuthSession, type SessionUser } from '../auth/auth-session';
import { heapsightDb } from '../db/heapsight-db';
import { SyncService } from './sync.service';

// jsdom has no structuredClone, which fake-indexeddb uses to store values; Node's serializer is the same algorithm.
globalThis.structuredClone ??= <T>(value: T): T => deserialize(serialize(value)) as T;

const SAMPLER: SessionUser = {
  id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01', organizationId: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c02', email: 'crew@example.test', name: 'Crew',
  role: 'sampler', labName: null, siteIds: [], sites: [], deviceId: null, deviceName: null,
};

describe('SyncService', () => {
  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
  });

  afterEach(async () => {
    await heapsightDb().delete();
  });

  it('registers the device for its code number as soon as someone signs in, and keeps the number', async () => {
    const http = TestBed.inject(HttpTestingController);
    const sync = TestBed.inject(SyncService);
    TestBed.tick();
    http.expectNone('/api/sync/device');

    TestBed.inject(AuthSession).signIn(SAMPLER, { accessToken: 'a', refreshToken: 'r' });
    TestBed.tick();

    const registration = await eventually(() => http.match('/api/sync/device')[0] ?? null);
    expect(registration.request.method).toBe('POST');
    expect(registration.request.body).toEqual({ deviceId: await sync.deviceId() });
    registration.flush({ deviceId: registration.request.body.deviceId, deviceNumber: 7 });
    // The number is kept on the phone: codes made later, with no signal, use it.
    expect(await eventually(async () => (await heapsightDb().syncState.get('deviceNumber'))?.value)).toBe(7);
    expect(await sync.deviceNumber()).toBe(7);
    http.expectNone('/api/sync/device');
  });
});
