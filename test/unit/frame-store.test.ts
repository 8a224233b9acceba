/**
 * The store's frames: replay frames are kept, a live frame is given back to the run worker
 * once a newer one is on show, clearing gives back everything once, and the field view's
 * requests reach whoever listens (the controller, which sends them to the worker).
 */
import { describe, expect, it } from 'vitest';
import type { FieldFrame } from '../../src/app/protocol.ts';
import { Store, type AppState, type FrameDemand } from '../../src/app/store.ts';

function frame(step: number, film: boolean, size = 16): FieldFrame {
  const data = new Float32Array(size);
  data[0] = step + 1;
  return { runId: 1, step, width: 4, height: size / 4, stride: 1, film, data };
}

function storeWithDemands(): { store: Store; demands: FrameDemand[] } {
  const store = new Store({} as AppState);
  const demands: FrameDemand[] = [];
  store.onFrameDemand((d) => demands.push(d));
  return { store, demands };
}

const givenBack = (demands: FrameDemand[]) => demands.flatMap((d) => (d.type === 'recycle' ? d.buffers : []));
/** The same buffers in the same order (compared by identity: the buffers themselves travel). */
const same = (a: ArrayBufferLike[], b: ArrayBufferLike[]) => a.length === b.length && a.every((x, k) => x === b[k]);

describe('Store frames', () => {
  it('keeps replay frames and gives back a live frame once a newer frame is on show', () => {
    const { store, demands } = storeWithDemands();
    const a = frame(10, true);
    const b = frame(15, false);
    const c = frame(20, false);
    const d = frame(30, true);
    store.setFrame(a);
    store.setFrame(b);
    expect(givenBack(demands)).toEqual([]); // a is film, b is on show: common practice, no source
    store.setFrame(c);
    expect(same(givenBack(demands), [b.data.buffer])).toBe(true); // common practice, no source
    store.setFrame(d);
    expect(same(givenBack(demands), [b.data.buffer, c.data.buffer])).toBe(true); // common practice, no source
    expect(store.film.map((f) => f.step)).toEqual([10, 30]); // common practice, no source
    expect(store.frame?.step).toBe(30); // common practice, no source
  });

  it('clearing gives back the film and the frame on show, each buffer once', () => {
    const { store, demands } = storeWithDemands();
    const frames = [frame(1, true), frame(2, true), frame(3, false)];
    for (const f of frames) store.setFrame(f);
    store.setFrame(undefined);
    const buffers = givenBack(demands);
    expect(new Set(buffers).size).toBe(buffers.length); // common practice, no source
    expect(buffers.length).toBe(frames.length); // common practice, no source
    expect(frames.every((f) => buffers.includes(f.data.buffer as ArrayBuffer))).toBe(true); // common practice, no source
    expect(store.film).toEqual([]); // common practice, no source
    expect(store.frame).toBeUndefined(); // common practice, no source
    store.setFrame(undefined);
    expect(givenBack(demands).length).toBe(buffers.length); // nothing twice, common practice, no source
  });

  it('gives back the replay frames it drops when the film outgrows its budget, keeping the last', () => {
    const { store, demands } = storeWithDemands();
    const big = 4 * 2 ** 20; // 16 MiB a frame: the 96 MiB budget holds six
    const frames = Array.from({ length: 8 }, (_, k) => frame(k, true, big));
    for (const f of frames) store.setFrame(f);
    const kept = store.film;
    expect(kept[kept.length - 1]).toBe(store.frame); // common practice, no source
    expect(kept.length).toBeLessThan(frames.length); // common practice, no source
    const dropped = frames.filter((f) => !kept.some((k) => k.data.buffer === f.data.buffer)).map((f) => f.data.buffer);
    expect(dropped.length).toBeGreaterThan(0); // common practice, no source
    expect(same(givenBack(demands), dropped)).toBe(true); // common practice, no source
  });

  it('passes the field view\'s requests on', () => {
    const { store, demands } = storeWithDemands();
    store.requestFrame();
    store.fieldOnScreen(false);
    expect(demands).toEqual([{ type: 'frame' }, { type: 'view', visible: false }]); // common practice, no source
  });
});
