import { retryDelay, type FlushResult, type OfflineQueue, type QueueSender, type QueueState } from './queue';

export interface SchedulerOptions {
  /** After each send, with the queue as it was before it (to tell which inspections changed). */
  onFlushed?(r: FlushResult, before: QueueState): void;
  delay?(attempt: number): number;
}

/**
 * When the queue is sent: at once when asked (app start, the connection back, the page shown again,
 * the inspector's "Send now"), and on a growing backoff while the server fails. One send at a time:
 * a request while one runs is remembered and run right after it, so nothing is sent twice and no
 * entry overtakes another.
 */
export class SendScheduler {
  private attempt = 0;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private running: Promise<void> | null = null;
  private again = false;
  private stopped = false;

  constructor(
    private readonly queue: OfflineQueue,
    private readonly sender: QueueSender,
    private readonly opts: SchedulerOptions = {},
  ) {}

  /** Send now and start the backoff again from its shortest step. */
  sendNow(): Promise<void> {
    this.attempt = 0;
    this.clearTimer();
    return this.start();
  }

  /** Something was queued: send it unless a send or a backoff wait is already under way (it will take it). */
  kick(): Promise<void> {
    if (this.timer && !this.running) return Promise.resolve();
    return this.start();
  }

  /** The wait before the next try, in ms, or null when none is planned (for tests and the panel). */
  get nextDelay(): number | null {
    return this.timer ? this.plannedDelay : null;
  }
  private plannedDelay = 0;

  stop() {
    this.stopped = true;
    this.clearTimer();
  }

  private clearTimer() {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
  }

  private start(): Promise<void> {
    this.stopped = false;
    if (this.running) {
      this.again = true;
      return this.running;
    }
    // A request that came just as the loop ended is still honoured, and its caller waits for it.
    const p: Promise<void> = this.loop().then(() => {
      if (this.running === p) this.running = null;
      if (this.again && !this.stopped) return this.start();
    });
    this.running = p;
    return p;
  }

  private async loop() {
    let last: FlushResult;
    do {
      this.again = false;
      const before = this.queue.snapshot();
      try {
        last = await this.queue.flush(this.sender);
      } catch {
        // The device's storage failed (full, blocked): try again later like a server error.
        last = { outcome: 'retry', sent: [], failed: [] };
      }
      this.opts.onFlushed?.(last, before);
    } while (this.again && !this.stopped);
    if (this.stopped) return;
    // Signed out: retrying cannot help; signing in again starts the app, which sends at once.
    if (last.outcome === 'done' || last.outcome === 'signed_out') {
      this.attempt = 0;
      return;
    }
    this.plannedDelay = (this.opts.delay ?? retryDelay)(this.attempt++);
    this.clearTimer();
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.start();
    }, this.plannedDelay);
  }
}
