/**
 * The page's player: one playback clock, many voices. The position is a
 * function of the audio clock — position = anchorPosition +
 * (context.currentTime − anchorTime), wrapped into the loop — so it does not
 * depend on which render sounds. Showing another render (another wiring, or
 * the same at new knob settings) starts it at the clock's position a few
 * milliseconds ahead and crossfades linearly (the renders are the same
 * performance, so the sum stays level), keeping the place in the phrase and
 * avoiding a click.
 */
import { type LoopRegion, decibelsToGain, wrapPosition } from './page-math.js';

/** Crossfade at a switch, seek or pause, s (our choice: short enough to keep the place, long enough to hide a click). */
export const CROSSFADE_S = 0.025;
/** New voices start this far ahead of the audio clock so their start is never in the past, s (our own margin; a render quantum at 48 kHz is 2.7 ms). */
export const SCHEDULE_AHEAD_S = 0.02;

/** What a voice plays. */
export interface Playable {
  readonly key: string;
  readonly buffer: AudioBuffer;
  readonly peak: number;
}

interface Voice {
  readonly playable: Playable;
  readonly source: AudioBufferSourceNode;
  readonly gain: GainNode;
}

export type PlayerEvent = 'play' | 'sound' | 'pause' | 'ended' | 'loop';

export interface Player {
  /** The audio context (made on first need). */
  context(): AudioContext;
  /** Sound `playable` from the clock's position (starting playback if stopped and `start`). */
  show(playable: Playable, start: boolean): void;
  pause(): void;
  seek(seconds: number): void;
  setLoop(loop: LoopRegion | null): void;
  /** Re-read the gain of every sounding voice. */
  refreshGains(): void;
  setVolume(volume: number): void;
  tick(): void;
  position(): number;
  /** The audio clock the position follows (the context's currentTime, s; 0 before the first play). */
  clock(): number;
  isPlaying(): boolean;
  current(): Playable | null;
  loop(): LoopRegion | null;
  soundingKeys(): string[];
  onChange(listener: (event: PlayerEvent) => void): void;
}

export interface PlayerSettings {
  readonly sampleRateHz: number;
  readonly volume: number;
  /** Playback gain of a render, dB. */
  readonly gainDb: (playable: Playable) => number;
}

export function createPlayer(settings: PlayerSettings): Player {
  let context: AudioContext | null = null;
  let master: GainNode | null = null;
  let voices: Voice[] = [];
  let playing = false;
  let anchorTime = 0;
  let anchorPosition = 0;
  let stoppedAt = 0;
  let duration = 0;
  let loop: LoopRegion | null = null;
  let volume = settings.volume;
  let current: Playable | null = null;
  const listeners: ((event: PlayerEvent) => void)[] = [];
  const notify = (event: PlayerEvent): void => listeners.forEach((listener) => listener(event));

  function ensureContext(): AudioContext {
    if (context) return context;
    try {
      context = new AudioContext({ sampleRate: settings.sampleRateHz, latencyHint: 'interactive' });
    } catch {
      context = new AudioContext();
    }
    master = context.createGain();
    master.gain.value = volume;
    master.connect(context.destination);
    return context;
  }

  const clockPosition = (time: number): number => wrapPosition(anchorPosition + (time - anchorTime), loop);
  const position = (): number => (!playing || !context ? stoppedAt : Math.max(0, clockPosition(context.currentTime)));

  function holdAndRamp(param: AudioParam, when: number, value: number): void {
    param.cancelAndHoldAtTime(when);
    param.linearRampToValueAtTime(value, when + CROSSFADE_S);
  }

  function fadeOut(voice: Voice, when: number): void {
    holdAndRamp(voice.gain.gain, when, 0);
    try {
      voice.source.stop(when + CROSSFADE_S + SCHEDULE_AHEAD_S);
    } catch {
      // already stopped
    }
    voices = voices.filter((other) => other !== voice);
  }

  function startVoice(playable: Playable, when: number, offset: number): void {
    const audio = ensureContext();
    const source = audio.createBufferSource();
    source.buffer = playable.buffer;
    if (loop) {
      source.loop = true;
      source.loopStart = loop.start;
      source.loopEnd = loop.end;
    }
    const gain = audio.createGain();
    gain.gain.setValueAtTime(0, when);
    gain.gain.linearRampToValueAtTime(decibelsToGain(settings.gainDb(playable)), when + CROSSFADE_S);
    source.connect(gain);
    gain.connect(master as GainNode);
    source.onended = () => {
      source.disconnect();
      gain.disconnect();
    };
    source.start(when, Math.min(offset, Math.max(0, playable.buffer.duration - 0.001)));
    voices.push({ playable, source, gain });
  }

  /** Keep positions inside the loop when one is set, inside the render otherwise. */
  function placeable(offset: number, length: number): number {
    if (loop && (offset < loop.start || offset >= loop.end)) return loop.start;
    return offset >= length ? 0 : Math.max(0, offset);
  }

  function sound(playable: Playable): void {
    const audio = ensureContext();
    const when = audio.currentTime + SCHEDULE_AHEAD_S;
    const offset = placeable(playing ? clockPosition(when) : stoppedAt, playable.buffer.duration);
    for (const voice of voices.slice()) fadeOut(voice, when);
    startVoice(playable, when, offset);
    anchorTime = when;
    anchorPosition = offset;
    duration = playable.buffer.duration;
    current = playable;
    if (!playing) {
      playing = true;
      notify('play');
    }
    notify('sound');
  }

  return {
    context: ensureContext,
    show(playable, start) {
      if (!playing && !start) {
        current = playable;
        duration = playable.buffer.duration;
        notify('sound');
        return;
      }
      const audio = ensureContext();
      if (audio.state === 'suspended') void audio.resume();
      sound(playable);
    },
    pause() {
      if (!playing || !context) return;
      stoppedAt = position();
      playing = false;
      const when = context.currentTime;
      for (const voice of voices.slice()) fadeOut(voice, when);
      notify('pause');
    },
    seek(seconds) {
      const target = Math.max(0, seconds);
      stoppedAt = target;
      if (!playing || !current) return;
      playing = false;
      sound(current);
    },
    setLoop(region) {
      loop = region && region.end > region.start ? { start: region.start, end: region.end } : null;
      if (playing && current) {
        stoppedAt = position();
        playing = false;
        sound(current);
      }
      notify('loop');
    },
    refreshGains() {
      if (!context) return;
      const when = context.currentTime;
      for (const voice of voices) holdAndRamp(voice.gain.gain, when, decibelsToGain(settings.gainDb(voice.playable)));
    },
    setVolume(value) {
      volume = value;
      if (master && context) holdAndRamp(master.gain, context.currentTime, value);
    },
    tick() {
      if (playing && !loop && duration > 0 && context) {
        const now = context.currentTime;
        if (anchorPosition + (now - anchorTime) >= duration) {
          playing = false;
          stoppedAt = 0;
          for (const voice of voices.slice()) fadeOut(voice, now);
          notify('ended');
        }
      }
    },
    position,
    clock: () => context?.currentTime ?? 0,
    isPlaying: () => playing,
    current: () => current,
    loop: () => loop,
    soundingKeys: () => voices.map((voice) => voice.playable.key),
    onChange: (listener) => {
      listeners.push(listener);
    },
  };
}
