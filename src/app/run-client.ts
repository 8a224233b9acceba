import type { FromWorker, ToWorker } from './protocol.ts';

/** Posts a command, handing over (not copying) the buffers it gives back. */
function post(worker: Worker, message: ToWorker): void {
  worker.postMessage(message, message.type === 'recycle' ? message.buffers : []);
}

export interface RunClientHandlers {
  message(m: FromWorker): void;
  /** The worker died (an uncaught error, or it could not load); a fresh one is started. */
  crash(message: string): void;
}

/**
 * Owns the run worker: starts it, holds commands until it has said "ready", and replaces
 * it when it crashes, so the page recovers without a reload (telling the fresh worker
 * whether the field view is on screen). A worker that dies before it is ready twice in a
 * row is not started again (the script or engine cannot load).
 */
export class RunClient {
  private worker!: Worker;
  private ready!: Promise<void>;
  private isReady = false;
  private pending: ToWorker[] = [];
  private earlyDeaths = 0;
  private dead = false;
  /** The page's last word on whether the field view is on screen, told again to a fresh worker. */
  private view: (ToWorker & { type: 'view' }) | undefined;

  constructor(private readonly handlers: RunClientHandlers) {
    this.spawn();
  }

  /** Resolves once the current worker has compiled the engine. */
  whenReady(): Promise<void> {
    return this.ready;
  }

  private spawn(): void {
    const worker = new Worker(new URL('./run-worker.ts', import.meta.url), { type: 'module', name: 'gridgauge-run' });
    this.worker = worker;
    this.isReady = false;
    this.ready = new Promise((resolve) => {
      worker.onmessage = (event: MessageEvent<FromWorker | 'ready'>) => {
        if (worker !== this.worker) return;
        if (event.data === 'ready') {
          this.isReady = true;
          this.earlyDeaths = 0;
          if (this.view && !this.pending.includes(this.view)) worker.postMessage(this.view);
          for (const m of this.pending.splice(0)) post(worker, m);
          resolve();
          return;
        }
        this.handlers.message(event.data);
      };
    });
    worker.onerror = (event: ErrorEvent) => {
      event.preventDefault();
      if (worker !== this.worker) return;
      this.onDeath(event.message || 'the run worker stopped unexpectedly');
    };
    worker.onmessageerror = () => {
      if (worker === this.worker) this.onDeath('a message from the run worker could not be read');
    };
  }

  private onDeath(message: string): void {
    this.worker.terminate();
    if (!this.isReady) this.earlyDeaths++;
    if (this.earlyDeaths >= 2) {
      this.dead = true;
      this.handlers.crash(`${message}; the run worker could not be started, reload the page to try again`);
      return;
    }
    this.spawn();
    this.handlers.crash(message);
  }

  /** Sends a command now, or as soon as the worker is ready. False when no worker can run. */
  send(message: ToWorker): boolean {
    if (message.type === 'view') this.view = message;
    if (this.dead) return false;
    if (this.isReady) post(this.worker, message);
    else this.pending.push(message);
    return true;
  }

  /** Drops the current worker (and any run in it) and starts a fresh one. */
  restart(): void {
    this.pending = [];
    this.worker.terminate();
    this.spawn();
  }
}
