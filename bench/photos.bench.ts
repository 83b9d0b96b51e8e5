/**
 * Photos. (1) Server thumbnails per second: 1600 px JPEGs (what devices upload) through the
 * server's own ImageJobs (decode, 320 px thumbnail, encode, with jimp, in a worker thread), beside bare
 * jimp doing the same work in a plain loop on the main thread (so the ratio is the worker's overhead);
 * and the longest stall of the main thread's event loop during each, which is what requests in
 * flight feel while the server makes thumbnails.
 * (2) Device-side resize of a 12-megapixel camera JPEG in Chromium, the capture screen's way
 * (createImageBitmap, canvas to 1600 px JPEG 0.85 and a 240 px thumbnail), beside jimp doing the
 * same resize in Node in the same run. Images are invented: seeded noise over a gradient.
 */
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { Jimp } from 'jimp';
import { ImageJobs } from '../server/photos/image-jobs';
import { seededRandom } from '../shared/engine';
import { BENCH_SIZE, medianMs, reportFigure, timeIt } from './report';
import { launchChromium, median } from './support/browser';

const isFull = BENCH_SIZE === 'full';
const UPLOADS = isFull ? 40 : 8;
const DEVICE_RUNS = isFull ? 5 : 2;

/** A photo-like JPEG: a colour gradient with seeded noise, so it compresses like a real picture. */
async function makeJpeg(width: number, height: number, seed: number): Promise<Buffer> {
  const random = seededRandom(seed);
  const image = new Jimp({ width, height });
  const data = image.bitmap.data;
  for (let y = 0; y < height; y += 1) {
    for (let x = 0; x < width; x += 1) {
      const at = (y * width + x) * 4;
      const noise = random() * 40;
      data[at] = (x / width) * 200 + noise;
      data[at + 1] = (y / height) * 180 + noise;
      data[at + 2] = 90 + noise;
      data[at + 3] = 255;
    }
  }
  return image.getBuffer('image/jpeg', { quality: 85 });
}

async function serverThumbnails(): Promise<void> {
  const uploads = await Promise.all([1, 2, 3, 4].map((seed) => makeJpeg(1600, 1200, seed)));
  const jobs = new ImageJobs();
  // A first job starts the worker thread, as the first upload after a quiet spell would.
  await new Promise<void>((resolve, reject) => void jobs.decodeThenThumbnail(uploads[0], 'image/jpeg', async () => resolve()).catch(reject));
  const queuedStall = monitorEventLoopDelay({ resolution: 5 });
  queuedStall.enable();
  const queued = await timeIt(async () => {
    const done: Promise<void>[] = [];
    for (let index = 0; index < UPLOADS; index += 1) {
      done.push(new Promise<void>((resolve, reject) => {
        jobs.decodeThenThumbnail(uploads[index % uploads.length], 'image/jpeg', async () => resolve()).catch(reject);
      }));
    }
    await Promise.all(done);
  });
  queuedStall.disable();
  await jobs.close();
  const bareStall = monitorEventLoopDelay({ resolution: 5 });
  bareStall.enable();
  const bare = await timeIt(async () => {
    for (let index = 0; index < UPLOADS; index += 1) {
      const image = await Jimp.read(uploads[index % uploads.length]);
      image.resize({ w: 320, h: 240 });
      await image.getBuffer('image/jpeg', { quality: 75 });
    }
  });
  bareStall.disable();
  reportFigure({
    group: 'photos', name: `server thumbnails of 1600x1200 JPEG uploads (ImageJobs worker thread, ${UPLOADS} uploads)`, value: UPLOADS / (queued.ms / 1000), unit: 'photos/s',
    baselineName: 'bare jimp loop on the main thread, same images', baselineValue: UPLOADS / (bare.ms / 1000), higherIsBetter: true,
  });
  reportFigure({
    group: 'photos', name: 'longest event-loop stall of the server while making those thumbnails', value: queuedStall.max / 1e6, unit: 'ms',
    baselineName: 'bare jimp loop on the main thread', baselineValue: bareStall.max / 1e6, higherIsBetter: false,
  });
}

/**
 * The capture screen's resize, run in the page. A string, because tsx would add helper calls to a
 * compiled function that do not exist in the page.
 */
const RESIZE_IN_PAGE = `async (base64) => {
  const bytes = Uint8Array.from(atob(base64), (char) => char.charCodeAt(0));
  const file = new Blob([bytes], { type: 'image/jpeg' });
  const started = performance.now();
  const bitmap = await createImageBitmap(file);
  const draw = (longSide, quality) => {
    const scale = Math.min(1, longSide / Math.max(bitmap.width, bitmap.height));
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(bitmap.width * scale);
    canvas.height = Math.round(bitmap.height * scale);
    canvas.getContext('2d').drawImage(bitmap, 0, 0, canvas.width, canvas.height);
    return new Promise((resolve) => canvas.toBlob(resolve, 'image/jpeg', quality));
  };
  await draw(1600, 0.85);
  await draw(240, 0.7);
  bitmap.close();
  return performance.now() - started;
}`;

async function deviceResize(): Promise<void> {
  const camera = await makeJpeg(4000, 3000, 12);
  const jimpMs = await medianMs(isFull ? 3 : 1, async () => {
    const image = await Jimp.read(camera);
    image.resize({ w: 1600, h: 1200 });
    await image.getBuffer('image/jpeg', { quality: 85 });
  });
  const browser = await launchChromium();
  try {
    const page = await browser.newPage();
    await page.goto('about:blank');
    const times: number[] = [];
    for (let run = 0; run < DEVICE_RUNS; run += 1) {
      times.push(Number(await page.evaluate(`(${RESIZE_IN_PAGE})(${JSON.stringify(camera.toString('base64'))})`)));
    }
    process.stdout.write(`12 MP resize in Chromium: ${times.map((time) => time.toFixed(0)).join(', ')} ms; jimp ${jimpMs.toFixed(0)} ms; JPEG ${(camera.length / 1e6).toFixed(1)} MB\n`);
    reportFigure({
      group: 'photos', name: '12 MP camera JPEG to 1600 px + 240 px thumbnail in Chromium (createImageBitmap + canvas)', value: median(times), unit: 'ms',
      baselineName: 'jimp in Node, 12 MP to 1600 px only', baselineValue: jimpMs, higherIsBetter: false, note: `median of ${DEVICE_RUNS}; headless desktop Chromium, not a phone`,
    });
  } finally {
    await browser.close();
  }
}

async function main(): Promise<void> {
  await serverThumbnails();
  await deviceResize();
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
  process.exit(1);
});
