import { extname, join } from 'node:path';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';

export { THUMBNAIL_LONG_SIDE_PX } from './thumbnail-worker';

/** What decoding proved about an upload. */
export interface DecodedImage {
  readonly width: number;
  readonly height: number;
}

/** A worker with nothing to do for this long exits and gives its memory back. */
const IDLE_WORKER_MS = 30_000;

/**
 * Image work in one worker thread (piscina), one job at a time, so the event loop keeps answering
 * requests while jimp decodes, and a burst of uploads at camp never decodes several 1600 px images at
 * once (jimp holds each decoded image as raw RGBA, ~10 MB). An upload waits only for the decode that
 * proves it is an image; the thumbnail is made after the answer has gone.
 */
export class ImageJobs {
  private readonly pool = new Piscina({ ...workerFile(), minThreads: 0, maxThreads: 1, idleTimeout: IDLE_WORKER_MS });
  private pending = 0;
  private idleWaiters: (() => void)[] = [];

  /**
   * Decodes the bytes (rejecting what is not an image) and then, in the same job, makes the
   * thumbnail and hands it to `onThumbnail`. Resolves as soon as the decode is done.
   */
  decodeThenThumbnail(bytes: Buffer, contentType: string, onThumbnail: (thumbnail: Buffer) => Promise<void>): Promise<DecodedImage> {
    this.pending += 1;
    const { port1: decoded, port2: port } = new MessageChannel();
    const size = new Promise<DecodedImage>((resolve) => decoded.once('message', resolve));
    const job = this.pool.run({ bytes, contentType, port }, { transferList: [port] }) as Promise<Uint8Array>;
    const thumbnailKept = job.then((thumbnail) => onThumbnail(Buffer.from(thumbnail.buffer, thumbnail.byteOffset, thumbnail.byteLength)));
    void thumbnailKept
      .catch(() => undefined)
      .finally(() => {
        decoded.close();
        this.pending -= 1;
        if (this.pending === 0) {
          this.idleWaiters.splice(0).forEach((wake) => wake());
        }
      });
    // The size comes first when the bytes decode; a failed decode rejects the job before any size.
    return Promise.race([size, job.then(() => size)]);
  }

  /** Resolves once every queued job has finished (tests and shutdown). */
  idle(): Promise<void> {
    return this.pending === 0 ? Promise.resolve() : new Promise((resolve) => this.idleWaiters.push(resolve));
  }

  /** Stops the worker (shutdown); jobs still queued are refused. */
  close(): Promise<void> {
    return this.pool.destroy();
  }
}

/**
 * The worker's file beside this one: `.js` in the built server; `.ts` under Jest and tsx, where the
 * worker needs tsx's loader to read TypeScript.
 */
function workerFile(): { filename: string; execArgv?: string[] } {
  const extension = extname(__filename);
  const filename = join(__dirname, `thumbnail-worker${extension}`);
  return extension === '.ts' ? { filename, execArgv: ['--require', require.resolve('tsx/cjs')] } : { filename };
}
