/**
 * The renders a page keeps ready to play, both pages' one cache: pending
 * renders by key (the most recently asked for last), and the finished ones
 * the player reads gains from. Beyond `limit` the oldest is dropped, but a
 * finished render stays readable while it still sounds.
 */
import type { RenderedWiring } from './wiring-engine.js';

/** Renders a page keeps ready to play (each a few MB of float32; our own bound). */
export const RENDERS_KEPT = 24;

export interface RenderCache {
  /** The render under `key`, made by `make` on first need (a failed one is forgotten, so the next ask tries again). */
  render(key: string, make: () => Promise<RenderedWiring>): Promise<RenderedWiring>;
  /** The finished render under `key`, if any. */
  played(key: string): RenderedWiring | undefined;
}

export function createRenderCache(limit: number, sounding: () => readonly string[]): RenderCache {
  const renders = new Map<string, Promise<RenderedWiring>>();
  const played = new Map<string, RenderedWiring>();
  return {
    render(key, make) {
      let pending = renders.get(key);
      if (pending) {
        renders.delete(key);
        renders.set(key, pending);
        return pending;
      }
      pending = make();
      renders.set(key, pending);
      pending.then((render) => played.set(key, render)).catch(() => renders.delete(key));
      while (renders.size > limit) {
        const oldest = renders.keys().next().value as string;
        renders.delete(oldest);
        if (!sounding().includes(oldest)) played.delete(oldest);
      }
      return pending;
    },
    played: (key) => played.get(key),
  };
}
