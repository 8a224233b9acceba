/**
 * Reactive controllers (Lit's ReactiveController): each owns one concern of a component's
 * life — a subscription, a resize observer, a timer, a long-running study — and starts and
 * stops it with the host, so components need no hand-written connected/disconnected code.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';

type Host = ReactiveControllerHost & HTMLElement;

/**
 * Listens to `event` on `target` while the host is connected: calls `handler`, or by
 * default re-renders the host (the store's "change"). The target may be the host itself
 * (events its children send up) or `window` (hashchange).
 */
export class EventController<E extends Event = Event> implements ReactiveController {
  private readonly onEvent = (e: Event) => (this.handler ? this.handler(e as E) : this.host.requestUpdate());
  constructor(
    private readonly host: Host, private readonly target: () => EventTarget | undefined, private readonly event = 'change',
    private readonly handler?: (e: E) => void,
  ) {
    host.addController(this);
  }
  hostConnected(): void { this.target()?.addEventListener(this.event, this.onEvent); }
  hostDisconnected(): void { this.target()?.removeEventListener(this.event, this.onEvent); }
}

/** Calls `listen` through a subscribe function that returns its own unsubscribe (frames, the store's film). */
export class SubscriptionController<T> implements ReactiveController {
  private unsubscribe: (() => void) | undefined;
  constructor(host: Host, private readonly subscribe: () => ((listen: (value: T) => void) => () => void) | undefined, private readonly listen: (value: T) => void) {
    host.addController(this);
  }
  /** Subscribes again (the source changed). */
  renew(): void {
    this.unsubscribe?.();
    this.unsubscribe = this.subscribe()?.(this.listen);
  }
  hostConnected(): void { this.renew(); }
  hostDisconnected(): void {
    this.unsubscribe?.();
    this.unsubscribe = undefined;
  }
}

/** Observes the size of an element of the host's shadow root (found after the first render). */
export class ResizeController implements ReactiveController {
  private observer: ResizeObserver | undefined;
  private observed: Element | undefined;
  constructor(host: Host, private readonly target: () => Element | null | undefined, private readonly onResize: (rect: DOMRectReadOnly) => void) {
    host.addController(this);
  }
  hostUpdated(): void {
    const el = this.target() ?? undefined;
    if (el === this.observed) return;
    this.observer?.disconnect();
    this.observed = el;
    if (!el) return;
    this.observer ??= new ResizeObserver((entries) => this.onResize(entries[0].contentRect));
    this.observer.observe(el);
  }
  hostDisconnected(): void {
    this.observer?.disconnect();
    this.observer = undefined;
    this.observed = undefined;
  }
}

/** A repeating timer that runs only while started and the host is connected. */
export class IntervalController implements ReactiveController {
  private timer: ReturnType<typeof setInterval> | undefined;
  private wanted: number | undefined;
  constructor(host: Host, private readonly tick: () => void) {
    host.addController(this);
  }
  get running(): boolean { return this.timer !== undefined; }
  start(ms: number): void {
    this.stop();
    this.wanted = ms;
    this.timer = setInterval(this.tick, ms);
  }
  stop(): void {
    if (this.timer !== undefined) clearInterval(this.timer);
    this.timer = undefined;
    this.wanted = undefined;
  }
  hostConnected(): void { if (this.wanted !== undefined && this.timer === undefined) this.timer = setInterval(this.tick, this.wanted); }
  hostDisconnected(): void {
    if (this.timer !== undefined) clearInterval(this.timer);
    this.timer = undefined;
  }
}

/** A one-shot timer: a pending call is replaced by a newer one and dropped when the host leaves. */
export class TimeoutController implements ReactiveController {
  private timer: ReturnType<typeof setTimeout> | undefined;
  constructor(host: Host) {
    host.addController(this);
  }
  once(ms: number, run: () => void): void {
    this.cancel();
    this.timer = setTimeout(() => { this.timer = undefined; run(); }, ms);
  }
  cancel(): void {
    if (this.timer !== undefined) clearTimeout(this.timer);
    this.timer = undefined;
  }
  hostConnected(): void {}
  hostDisconnected(): void { this.cancel(); }
}

/**
 * Calls `draw` once in the next animation frame however often `request` is called before
 * it, and never after the host has left the page.
 */
export class AnimationFrameController implements ReactiveController {
  private handle: number | undefined;
  constructor(host: Host, private readonly draw: () => void) {
    host.addController(this);
  }
  request(): void {
    if (this.handle !== undefined) return;
    this.handle = requestAnimationFrame(() => {
      this.handle = undefined;
      this.draw();
    });
  }
  hostConnected(): void {}
  hostDisconnected(): void {
    if (this.handle !== undefined) cancelAnimationFrame(this.handle);
    this.handle = undefined;
  }
}

/** Runs `teardown` when the host leaves the page (a worker pool, a chart), so it holds nothing afterwards. */
export class TeardownController implements ReactiveController {
  constructor(host: Host, private readonly teardown: () => void) {
    host.addController(this);
  }
  hostDisconnected(): void { this.teardown(); }
}

export type TaskStatus = 'idle' | 'running' | 'done' | 'cancelled' | 'failed';

/**
 * A long-running, cancellable piece of work in the shape of @lit/task: a status, an
 * AbortSignal handed to the work, progress, the value or the error, and re-rendering of the
 * host on every change. Leaving the page aborts it.
 */
export class TaskController<P, V> implements ReactiveController {
  status: TaskStatus = 'idle';
  progress: P | undefined;
  value: V | undefined;
  error = '';
  private controller: AbortController | undefined;

  constructor(private readonly host: Host) {
    host.addController(this);
  }

  /** Runs `work`; a second call while running is ignored. */
  async run(work: (signal: AbortSignal, progress: (p: P) => void) => Promise<V>): Promise<void> {
    if (this.status === 'running') return;
    const controller = (this.controller = new AbortController());
    this.status = 'running';
    this.progress = undefined;
    this.value = undefined;
    this.error = '';
    this.host.requestUpdate();
    try {
      this.value = await work(controller.signal, (p) => { this.progress = p; this.host.requestUpdate(); });
      this.status = controller.signal.aborted ? 'cancelled' : 'done';
    } catch (e) {
      this.status = 'failed';
      this.error = e instanceof Error ? e.message : String(e);
    }
    this.host.requestUpdate();
  }

  abort(): void { this.controller?.abort(); }

  /** Back to idle, forgetting the last value. */
  reset(): void {
    if (this.status === 'running') return;
    this.status = 'idle';
    this.progress = undefined;
    this.value = undefined;
    this.error = '';
    this.host.requestUpdate();
  }

  render<T>(views: { idle?: () => T; running?: () => T; done?: (v: V) => T; cancelled?: (v: V | undefined) => T; failed?: (e: string) => T }): T | undefined {
    switch (this.status) {
      case 'idle': return views.idle?.();
      case 'running': return views.running?.();
      case 'done': return views.done?.(this.value as V);
      case 'cancelled': return views.cancelled?.(this.value);
      case 'failed': return views.failed?.(this.error);
    }
  }

  hostConnected(): void {}
  hostDisconnected(): void { this.abort(); }
}
