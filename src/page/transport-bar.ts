/**
 * The player bar both pages share (render-listening-page.ts, renderTransport):
 * play button, position display and scrub, the level-match switch and the
 * volume, joined to the page's player. The page says what a press of play
 * does and what to redraw when anything changes.
 */
import { formatSeconds } from './page-math.js';
import type { Player } from './player.js';

/** Interval of the position display, ms. */
export const TICK_MS = 50;

/** The element with `id`; a page without it is a bug of the page, not of the input. */
export function byId<T extends HTMLElement>(id: string): T {
  const element = document.getElementById(id);
  if (!element) throw new Error(`the page lacks #${id}`);
  return element as T;
}

export interface TransportHost {
  readonly player: Player;
  /** Length of the phrase, s. */
  readonly durationS: number;
  /** Play or pause (the play button, Space). */
  readonly toggle: () => void;
  /** The level-match switch moved (gains are refreshed after). */
  readonly levelMode: (matched: boolean) => void;
  /** Redraw the labels (after any player event or level change). */
  readonly changed: () => void;
}

/** Join the bar to the player; returns the position display's update (call it after seeking). */
export function connectTransport(host: TransportHost): () => void {
  const { player } = host;
  const scrub = byId<HTMLInputElement>('scrub');
  const updateTime = (): void => {
    player.tick();
    const position = player.position();
    byId('time').textContent = `${formatSeconds(position)} / ${formatSeconds(host.durationS)}`;
    if (document.activeElement !== scrub) scrub.value = String(position);
  };
  player.onChange(() => {
    host.changed();
    updateTime();
  });
  byId('transport-play').addEventListener('click', host.toggle);
  scrub.addEventListener('input', () => player.seek(Number(scrub.value)));
  byId('match-level').addEventListener('change', () => {
    host.levelMode(byId<HTMLInputElement>('match-level').checked);
    player.refreshGains();
    host.changed();
  });
  byId('volume').addEventListener('input', () => player.setVolume(Number(byId<HTMLInputElement>('volume').value)));
  updateTime();
  setInterval(updateTime, TICK_MS);
  return updateTime;
}
