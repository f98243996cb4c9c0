/**
 * The listening page's audio loader, as script text inlined by the page.
 *
 * From file:// the page cannot fetch its WAVs, so each wiring's audio comes
 * from `wav/<name>.wav.js` (see page-audio-file.ts): the loader adds a
 * <script> element, the script calls `coilbenchAudio(id, base64)`, and the
 * bytes are decoded with an OfflineAudioContext, which needs no user gesture
 * and resamples to the render's rate. Decoded buffers are kept in a
 * least-recently-used cache of bounded size so 572 wirings do not fill memory.
 * A file that failed to load is not asked for again until the page reloads.
 * Requires the math script (isInsideFolder, pageAudioPath).
 */
import { PAGE_AUDIO_CALLBACK } from './page-audio-file.js';

/** Decoded buffers kept at once; a 6 s mono render at 48 kHz is about 1.2 MB as float32 (our own bound). */
export const AUDIO_CACHE_BUFFERS = 48;
/** Audio scripts loading at once (our own bound). */
export const AUDIO_PARALLEL_LOADS = 3;

export const PAGE_LOADER_SCRIPT = String.raw`
function createAudioLoader(sampleRateHz, isProtected) {
  var MAX_BUFFERS = ${AUDIO_CACHE_BUFFERS};
  var PARALLEL_LOADS = ${AUDIO_PARALLEL_LOADS};
  var cache = new Map();
  var inflight = new Map();
  var failed = new Map();
  var waiting = {};
  var queue = [];
  var active = 0;

  window.${PAGE_AUDIO_CALLBACK} = function (id, base64) {
    var entry = waiting[id];
    if (!entry) return;
    delete waiting[id];
    entry.resolve(base64);
  };

  function readScript(id, src) {
    return new Promise(function (resolve, reject) {
      waiting[id] = { resolve: resolve, reject: reject };
      var element = document.createElement('script');
      element.src = src;
      element.onload = function () {
        element.remove();
        if (waiting[id]) { delete waiting[id]; reject(new Error(src + ' holds no audio for ' + id)); }
      };
      element.onerror = function () {
        element.remove();
        delete waiting[id];
        reject(new Error('could not read ' + src));
      };
      document.head.appendChild(element);
    });
  }

  function decode(base64) {
    var text = atob(base64);
    var bytes = new Uint8Array(text.length);
    for (var i = 0; i < text.length; i += 1) bytes[i] = text.charCodeAt(i);
    var decoder = new OfflineAudioContext(1, 1, sampleRateHz);
    return decoder.decodeAudioData(bytes.buffer).then(function (buffer) {
      var peak = 0;
      for (var channel = 0; channel < buffer.numberOfChannels; channel += 1) {
        var samples = buffer.getChannelData(channel);
        for (var j = 0; j < samples.length; j += 1) { var size = Math.abs(samples[j]); if (size > peak) peak = size; }
      }
      return { buffer: buffer, peak: peak };
    });
  }

  function pump() {
    while (active < PARALLEL_LOADS && queue.length > 0) {
      var job = queue.shift();
      active += 1;
      readScript(job.id, job.src).then(decode).then(function (entry) {
        remember(this.id, entry);
        this.resolve(entry);
      }.bind(job), function (error) {
        failed.set(this.id, error);
        this.reject(error);
      }.bind(job)).then(function () {
        inflight.delete(this.id);
        active -= 1;
        pump();
      }.bind(job));
    }
  }

  function remember(id, entry) {
    cache.delete(id);
    cache.set(id, entry);
    if (cache.size <= MAX_BUFFERS) return;
    var ids = Array.from(cache.keys());
    for (var i = 0; i < ids.length && cache.size > MAX_BUFFERS; i += 1) {
      if (!isProtected(ids[i])) cache.delete(ids[i]);
    }
  }

  /* Promise of { buffer, peak } for a wiring ({ id, wav }). An urgent load
     (the wiring about to play) goes ahead of queued preloads. */
  function load(wiring, urgent) {
    var cached = cache.get(wiring.id);
    if (cached) { cache.delete(wiring.id); cache.set(wiring.id, cached); return Promise.resolve(cached); }
    var pending = inflight.get(wiring.id);
    if (pending) {
      var queued = queue.findIndex(function (job) { return job.id === wiring.id; });
      if (urgent && queued > 0) queue.unshift(queue.splice(queued, 1)[0]);
      return pending;
    }
    if (failed.has(wiring.id)) return Promise.reject(failed.get(wiring.id));
    if (!wiring.wav) return Promise.reject(new Error(wiring.id + ' was not rendered'));
    var src = pageAudioPath(wiring.wav);
    if (!isInsideFolder(src)) return Promise.reject(new Error(wiring.id + ': audio path outside the page folder refused'));
    var promise = new Promise(function (resolve, reject) {
      var job = { id: wiring.id, src: src, resolve: resolve, reject: reject };
      if (urgent) queue.unshift(job); else queue.push(job);
    });
    inflight.set(wiring.id, promise);
    pump();
    return promise;
  }

  function peek(id) { return cache.get(id) || null; }

  return { load: load, peek: peek };
}
`;
