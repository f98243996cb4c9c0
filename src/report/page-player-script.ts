/**
 * The listening page's player, as script text inlined by the page.
 *
 * One playback clock, many voices. The position is a function of the audio
 * clock — position = anchorPosition + (context.currentTime − anchorTime),
 * wrapped into the loop — so it does not depend on which wiring sounds.
 * Switching wiring starts the new wiring's AudioBufferSourceNode at exactly
 * the clock's position a few milliseconds ahead and crossfades linearly
 * (the renders are the same performance, so their sum stays level), which
 * keeps the place in the phrase and avoids a click. Seeking and loop changes
 * use the same crossfade. Requires the math script and a loader.
 */

/** Crossfade length at a switch, seek or pause, s (a short fade at each switch hides the click: common practice; 25 ms is our choice). */
export const CROSSFADE_S = 0.025;
/** Start new voices this far ahead of the audio clock so the start time is never in the past, s (our own margin; one render quantum at 48 kHz is 2.7 ms). */
export const SCHEDULE_AHEAD_S = 0.02;

export const PAGE_PLAYER_SCRIPT = String.raw`
function createPlayer(loader, settings) {
  var FADE_S = ${CROSSFADE_S};
  var AHEAD_S = ${SCHEDULE_AHEAD_S};
  var context = null;
  var master = null;
  var voices = [];
  var state = {
    playing: false, starting: false, id: null, wanted: null,
    anchorTime: 0, anchorPosition: 0, position: 0, duration: 0,
    loop: null, volume: settings.volume, request: 0
  };
  var listeners = [];

  function notify(event) { listeners.forEach(function (listener) { listener(event); }); }

  function ensureContext() {
    if (context) return context;
    var Context = window.AudioContext || window.webkitAudioContext;
    try { context = new Context({ sampleRate: settings.sampleRateHz, latencyHint: 'interactive' }); }
    catch (error) { context = new Context(); }
    master = context.createGain();
    master.gain.value = state.volume;
    master.connect(context.destination);
    return context;
  }

  function clockPosition(time) {
    return wrapPosition(state.anchorPosition + (time - state.anchorTime), state.loop);
  }

  function position() {
    if (!state.playing || !context) return state.position;
    return Math.max(0, clockPosition(context.currentTime));
  }

  function holdAndRamp(param, when, value) {
    if (param.cancelAndHoldAtTime) param.cancelAndHoldAtTime(when);
    else { param.cancelScheduledValues(when); param.setValueAtTime(param.value, when); }
    param.linearRampToValueAtTime(value, when + FADE_S);
  }

  function fadeOut(voice, when) {
    holdAndRamp(voice.gain.gain, when, 0);
    try { voice.source.stop(when + FADE_S + AHEAD_S); } catch (error) { /* already stopped */ }
    voices = voices.filter(function (other) { return other !== voice; });
  }

  function startVoice(id, entry, when, offset) {
    var source = context.createBufferSource();
    source.buffer = entry.buffer;
    if (state.loop) { source.loop = true; source.loopStart = state.loop.start; source.loopEnd = state.loop.end; }
    var gain = context.createGain();
    var level = decibelsToGain(settings.gainDb(id, entry.peak));
    gain.gain.setValueAtTime(0, when);
    gain.gain.linearRampToValueAtTime(level, when + FADE_S);
    source.connect(gain);
    gain.connect(master);
    source.onended = function () { source.disconnect(); gain.disconnect(); };
    source.start(when, Math.min(offset, Math.max(0, entry.buffer.duration - 0.001)));
    var voice = { id: id, source: source, gain: gain, peak: entry.peak, startTime: when, startOffset: offset };
    voices.push(voice);
    return voice;
  }

  /* Keep positions inside the loop when one is set, inside the render otherwise. */
  function placeable(offset, duration) {
    if (state.loop && (offset < state.loop.start || offset >= state.loop.end)) return state.loop.start;
    return offset >= duration ? 0 : Math.max(0, offset);
  }

  /* Sound wiring id from the clock's position, crossfading from whatever sounds. */
  function sound(id, entry) {
    var when = context.currentTime + AHEAD_S;
    var offset;
    if (state.playing) offset = clockPosition(when);
    else offset = state.position;
    offset = placeable(offset, entry.buffer.duration);
    voices.slice().forEach(function (voice) { fadeOut(voice, when); });
    startVoice(id, entry, when, offset);
    state.anchorTime = when;
    state.anchorPosition = offset;
    state.duration = entry.buffer.duration;
    state.id = id;
    if (!state.playing) { state.playing = true; notify('play'); }
    notify('sound');
  }

  /* Make wiring the one that plays (now, if playing). */
  function select(wiring) {
    state.wanted = wiring.id;
    var request = ++state.request;
    if (!state.playing && !state.starting) { state.id = wiring.id; notify('select'); return Promise.resolve(); }
    return loader.load(wiring, true).then(function (entry) {
      if (request !== state.request || (!state.playing && !state.starting)) return;
      state.starting = false;
      sound(wiring.id, entry);
    }, function (error) { state.starting = false; notify('error'); throw error; });
  }

  function play(wiring) {
    ensureContext();
    var resumed = context.state === 'suspended' ? context.resume() : Promise.resolve();
    state.starting = true;
    notify('loading');
    return resumed.then(function () { return select(wiring); });
  }

  function pause() {
    state.request += 1;
    state.starting = false;
    if (!state.playing) { notify('pause'); return; }
    state.position = position();
    state.playing = false;
    var when = context.currentTime;
    voices.slice().forEach(function (voice) { fadeOut(voice, when); });
    notify('pause');
  }

  function seek(seconds) {
    var target = Math.max(0, seconds);
    if (!state.playing) { state.position = target; notify('seek'); return; }
    var voice = voices[voices.length - 1];
    if (!voice) return;
    var entry = { buffer: voice.source.buffer, peak: voice.peak };
    state.anchorTime = context.currentTime + AHEAD_S;
    state.anchorPosition = target;
    state.playing = false;
    state.position = target;
    sound(voice.id, entry);
  }

  function setLoop(loop) {
    state.loop = loop && loop.end > loop.start ? { start: loop.start, end: loop.end } : null;
    if (state.playing) seek(position());
    notify('loop');
  }

  /* Re-read every sounding voice's gain (level mode or blind test changed). */
  function refreshGains() {
    if (!context) return;
    var when = context.currentTime;
    voices.forEach(function (voice) {
      holdAndRamp(voice.gain.gain, when, decibelsToGain(settings.gainDb(voice.id, voice.peak)));
    });
  }

  function setVolume(volume) {
    state.volume = volume;
    if (master) holdAndRamp(master.gain, context.currentTime, volume);
  }

  /* Called on a timer: a render that reaches its end without a loop stops and rewinds. */
  function tick() {
    if (state.playing && !state.loop && state.duration > 0) {
      var now = context.currentTime;
      if (state.anchorPosition + (now - state.anchorTime) >= state.duration) {
        state.playing = false;
        state.position = 0;
        voices.slice().forEach(function (voice) { fadeOut(voice, now); });
        notify('ended');
      }
    }
  }

  return {
    play: play, pause: pause, select: select, seek: seek, setLoop: setLoop,
    refreshGains: refreshGains, setVolume: setVolume, tick: tick, position: position,
    isPlaying: function () { return state.playing; },
    isStarting: function () { return state.starting; },
    currentId: function () { return state.id; },
    wantedId: function () { return state.wanted; },
    duration: function () { return state.duration; },
    loop: function () { return state.loop; },
    soundingIds: function () { return voices.map(function (voice) { return voice.id; }); },
    onChange: function (listener) { listeners.push(listener); }
  };
}
`;
