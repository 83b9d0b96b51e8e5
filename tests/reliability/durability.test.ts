import { createHash, randomUUID } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Jimp } from 'jimp';
import { SyncEngine, type SyncTransport } from '../../src/app/core/sync/sync-engine';
import { newPhoto, newPile, newSample, person } from '../server/sync/support/sync-test-app';
import { startChildServer, type ChildServer } from './support/child-server';
import { MemoryOutbox, httpTransport, signIn } from './support/device';
import { seededRandom } from './support/fault-proxy';
import { reportReliabilityFigures } from './support/figures';
import { queryFile } from './support/sqlite-file';

// A SIGKILLed server and PRAGMA integrity_check are about the embedded SQLite file; on PostgreSQL
// durability is the database server's own promise, so this story runs on SQLite only.
const describeOnSqlite = process.env['TEST_DATABASE_URL'] ? describe.skip : describe;

const SEED = Number(process.env['RELIABILITY_SEED'] ?? 20250305);
const DEVICES = 3;
const SAMPLES_PER_DEVICE = 299;
const PHOTOS_PER_DEVICE = 20;

/** One simulated phone: its outbox, its engine, and what the server has answered it. */
interface Device {
  readonly outbox: MemoryOutbox;
  readonly engine: SyncEngine;
  readonly photoBytes: Map<string, Buffer>;
}

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

async function smallJpeg(index: number): Promise<Buffer> {
  const image = new Jimp({ width: 48, height: 32, color: ((index * 2654435761) >>> 8 << 8 | 0xff) >>> 0 });
  return image.getBuffer('image/jpeg');
}

describeOnSqlite('a server killed with SIGKILL in the middle of pushes and photo uploads', () => {
  let dataDir: string;
  let server: ChildServer | null = null;

  beforeAll(() => {
    dataDir = mkdtempSync(join(tmpdir(), 'heapsight-durability-'));
  });

  afterAll(async () => {
    await server?.kill();
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('keeps every acknowledged mutation and photo, applies no batch by halves, passes its integrity check, and the devices converge after restart', async () => {
    // Arrange: three of the sampler's phones, each with a pile, 299 samples and 20 photos queued.
    const database = join(dataDir, 'heapsight.sqlite');
    const random = seededRandom(SEED);
    server = await startChildServer(dataDir);
    let url = server.url;
    let isUp = true;
    const sentBatches: string[][] = [];
    const answeredBatches = new Set<number>();
    let pushesInFlight = 0;
    let uploadsInFlight = 0;
    const acknowledgedPhotos = new Set<string>();
    const killAfterAnswers = 2 + Math.floor(random() * 5);
    const killAfterUploads = 5 + Math.floor(random() * 20);
    let killed: Promise<void> | null = null;
    const cutsInFlight: number[] = [];
    let phase: 'pushes' | 'uploads' | 'settle' = 'pushes';
    const killNow = () => {
      const dying = server as ChildServer;
      isUp = false;
      cutsInFlight.push(pushesInFlight + uploadsInFlight - 1);
      killed = dying.kill();
    };

    const sampler = person('sampler');
    const devices: Device[] = [];
    const sentMutationIds: string[] = [];
    const deviceIds: string[] = [];
    for (let deviceIndex = 0; deviceIndex < DEVICES; deviceIndex += 1) {
      const deviceId = randomUUID();
      deviceIds.push(deviceId);
      const token = await signIn(url, sampler.email, deviceId);
      const outbox = new MemoryOutbox();
      const photoBytes = new Map<string, Buffer>();
      const pile = newPile();
      sentMutationIds.push(outbox.queue('pile', pile).mutationId);
      const samples = Array.from({ length: SAMPLES_PER_DEVICE }, () => newSample(pile.id, { deviceId }));
      samples.forEach((sample) => sentMutationIds.push(outbox.queue('sample', sample).mutationId));
      for (let index = 0; index < PHOTOS_PER_DEVICE; index += 1) {
        const bytes = await smallJpeg(deviceIndex * PHOTOS_PER_DEVICE + index);
        const photo = newPhoto(samples[index].id, { byteSize: bytes.length, originalWidth: 48, originalHeight: 32 });
        sentMutationIds.push(outbox.queue('photo', photo).mutationId);
        outbox.photos.set(photo.id, { bytes, isUploaded: false });
        photoBytes.set(photo.id, bytes);
      }
      // The transport follows the server to its new port after each restart, and pulls the
      // trigger: the first kill lands when a push is answered while another is still in flight,
      // the second when a photo upload is answered while another is still being sent.
      const transport: SyncTransport = {
        push: async (request) => {
          const batch = sentBatches.push(request.mutations.map((mutation) => mutation.mutationId)) - 1;
          pushesInFlight += 1;
          try {
            const answer = await httpTransport(url, token).push(request);
            answeredBatches.add(batch);
            if (phase === 'pushes' && isUp && answeredBatches.size >= killAfterAnswers && pushesInFlight > 1) {
              killNow();
            }
            return answer;
          } finally {
            pushesInFlight -= 1;
          }
        },
        uploadPhoto: async (photoId, bytes) => {
          uploadsInFlight += 1;
          try {
            await httpTransport(url, token).uploadPhoto(photoId, bytes);
            acknowledgedPhotos.add(photoId);
            if (phase === 'uploads' && isUp && acknowledgedPhotos.size >= killAfterUploads && uploadsInFlight > 1) {
              killNow();
            }
          } finally {
            uploadsInFlight -= 1;
          }
        },
        pull: (since, limit) => httpTransport(url, token).pull(since, limit),
      };
      devices.push({ outbox, photoBytes, engine: new SyncEngine(outbox, transport, deviceId) });
    }
    const isDone = async (device: Device) => (await device.outbox.pendingEntries()).length === 0 && (await device.outbox.pendingPhotoUploads()).length === 0;
    /** Each device syncs again and again (bounded) until it is done or the server is gone. */
    const syncAllWhileUp = () => Promise.all(devices.map(async (device) => {
      for (let run = 0; run < 200 && isUp; run += 1) {
        const progress = await device.engine.run();
        if (progress.status === 'idle' && (await isDone(device))) {
          return;
        }
      }
    }));
    const acknowledgedMutations = () => devices.flatMap((device) => [...device.outbox.answers.keys()]);
    const restart = async () => {
      await killed;
      killed = null;
      server = await startChildServer(dataDir);
      url = server.url;
      isUp = true;
    };

    // Act 1: sync until the kill in the middle of the pushes.
    await syncAllWhileUp();
    expect(isUp).toBe(false);
    await killed;

    // Assert 1: the file is sound, every answered mutation is there, and each batch is all or nothing.
    expect(await queryFile<{ integrity_check: string }>(database, 'PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }]);
    const afterFirstKill = new Set((await queryFile<{ mutationId: string }>(database, 'SELECT mutationId FROM sync_mutations')).map((row) => row.mutationId));
    const acknowledgedAtFirstKill = acknowledgedMutations();
    expect(acknowledgedAtFirstKill.length).toBeGreaterThan(0);
    expect(acknowledgedAtFirstKill.filter((id) => !afterFirstKill.has(id))).toEqual([]);
    const batchShares = sentBatches.map((batch) => batch.filter((id) => afterFirstKill.has(id)).length / batch.length);
    expect(batchShares.filter((share) => share !== 0 && share !== 1)).toEqual([]);
    expect(sentBatches.length).toBeGreaterThan(answeredBatches.size);
    const [revisionsAfterFirstKill] = await queryFile<{ counter: number; highest: number }>(database,
      'SELECT (SELECT value FROM sync_revisions WHERE id = 1) AS counter, (SELECT MAX(revision) FROM change_log) AS highest');
    expect(revisionsAfterFirstKill.counter).toBe(revisionsAfterFirstKill.highest);

    // Act 2: restart on the same folder; the devices resend what was unanswered, then upload
    // photos until the second kill, in the middle of the uploads.
    await restart();
    phase = 'uploads';
    await syncAllWhileUp();
    expect(isUp).toBe(false);
    await killed;

    // Assert 2: every answered upload is stored whole, and no record claims a photo whose bytes are not all there.
    expect(await queryFile<{ integrity_check: string }>(database, 'PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }]);
    const bytesById = new Map(devices.flatMap((device) => [...device.photoBytes]));
    const storedAfterSecondKill = await queryFile<{ id: string; storedSizes: string }>(database, 'SELECT id, storedSizes FROM photos');
    const claimedFull = storedAfterSecondKill.filter((row) => (JSON.parse(row.storedSizes) as string[]).includes('full')).map((row) => row.id);
    expect([...acknowledgedPhotos].filter((id) => !claimedFull.includes(id))).toEqual([]);
    for (const id of claimedFull) {
      expect(sha256(readFileSync(join(dataDir, 'photos', id, 'full')))).toBe(sha256(bytesById.get(id) as Buffer));
    }
    const acknowledgedAtSecondKill = acknowledgedPhotos.size;

    // Act 3: restart once more and let every device finish.
    await restart();
    phase = 'settle';
    await syncAllWhileUp();
    for (const device of devices) {
      expect(await isDone(device)).toBe(true);
    }
    await (server as ChildServer).stop();
    server = null;

    // Assert 3: every mutation sent is on the server exactly once, and every photo whole.
    expect(await queryFile<{ integrity_check: string }>(database, 'PRAGMA integrity_check')).toEqual([{ integrity_check: 'ok' }]);
    const placeholders = sentMutationIds.map(() => '?').join(',');
    const found = await queryFile<{ mutationId: string; status: string }>(database, `SELECT mutationId, status FROM sync_mutations WHERE mutationId IN (${placeholders})`, sentMutationIds);
    expect(found).toHaveLength(sentMutationIds.length);
    expect(found.filter((row) => row.status !== 'applied')).toEqual([]);
    const [samples] = await queryFile<{ count: number }>(database, `SELECT COUNT(*) AS count FROM samples WHERE deviceId IN (${deviceIds.map(() => '?').join(',')})`, deviceIds);
    expect(samples.count).toBe(DEVICES * SAMPLES_PER_DEVICE);
    const photos = await queryFile<{ id: string; storedSizes: string }>(database, `SELECT id, storedSizes FROM photos WHERE id IN (${[...bytesById.keys()].map(() => '?').join(',')})`, [...bytesById.keys()]);
    expect(photos).toHaveLength(DEVICES * PHOTOS_PER_DEVICE);
    for (const photo of photos) {
      expect(JSON.parse(photo.storedSizes)).toContain('full');
      expect(existsSync(join(dataDir, 'photos', photo.id, 'full'))).toBe(true);
      expect(sha256(readFileSync(join(dataDir, 'photos', photo.id, 'full')))).toBe(sha256(bytesById.get(photo.id) as Buffer));
    }
    reportReliabilityFigures('SIGKILL durability', {
      seed: SEED, serverKills: 2, requestsCutInFlight: cutsInFlight.reduce((sum, count) => sum + count, 0),
      acknowledgedMutationsCheckedAfterKill: acknowledgedAtFirstKill.length, acknowledgedPhotosCheckedAfterKill: acknowledgedAtSecondKill,
      batchesSent: sentBatches.length, mutationsSent: sentMutationIds.length, mutationsFound: found.length,
      photosSent: bytesById.size, photosFound: photos.length, samplesFound: samples.count,
    });
  }, 150_000);
});
