/**
 * Pure helpers of the listening page's script, as script text: the page
 * inlines this string, and the Node tests run the very same text in a
 * `node:vm` context (see page-math-script.test.ts), so what is tested is
 * what runs in the browser. Plain ES2017, no template literals, no DOM.
 */
export const PAGE_MATH_SCRIPT = String.raw`
/* ABX: probability of k or more correct answers out of n by guessing, each
   trial right with probability 1/2 (one-sided binomial test):
   P(K >= k) = sum_{i=k..n} C(n,i) / 2^n. Terms in logs so large n neither
   overflows nor underflows: ln C(n,i+1) = ln C(n,i) + ln((n-i)/(i+1)). */
function binomialTailProbability(correct, trials) {
  if (!(trials >= 0) || correct <= 0) return 1;
  if (correct > trials) return 0;
  var logTerm = trials * Math.log(0.5);
  var total = 0;
  for (var i = 0; i <= trials; i += 1) {
    if (i >= correct) total += Math.exp(logTerm);
    logTerm += Math.log((trials - i) / (i + 1));
  }
  return Math.min(1, total);
}

function median(values) {
  var sorted = values.slice().sort(function (a, b) { return a - b; });
  if (sorted.length === 0) return 0;
  var middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/* Playback gains, dB, per wiring id, for both listening modes.
   File loudness F_i: a "true" render wrote every file with one common gain,
   so F_i = loudnessLufs_i + commonGainDb; a "matched" render wrote every
   file at one loudness (F_i equal, taken as 0).
   Matched mode plays every wiring at the median file loudness:
     gain_i = median(F) - F_i.
   True mode restores the measured differences, loudest wiring at 0 dB:
     gain_i = (L_i - F_i) - max_j (L_j - F_j).
   A wiring without a finite loudness gets 0 dB and is listed in unknown. */
function playbackGainsDb(wirings, render) {
  var fileLoudness = {};
  var usable = [];
  var unknown = [];
  wirings.forEach(function (wiring) {
    var loudness = wiring.loudnessLufs;
    if (typeof loudness !== 'number' || !isFinite(loudness)) { unknown.push(wiring.id); return; }
    fileLoudness[wiring.id] = render.level === 'matched' ? 0 : loudness + render.commonGainDb;
    usable.push(wiring);
  });
  var target = median(usable.map(function (wiring) { return fileLoudness[wiring.id]; }));
  var topRestore = -Infinity;
  usable.forEach(function (wiring) { topRestore = Math.max(topRestore, wiring.loudnessLufs - fileLoudness[wiring.id]); });
  var matched = {};
  var trueLevel = {};
  usable.forEach(function (wiring) {
    matched[wiring.id] = target - fileLoudness[wiring.id];
    trueLevel[wiring.id] = wiring.loudnessLufs - fileLoudness[wiring.id] - topRestore;
  });
  unknown.forEach(function (id) { matched[id] = 0; trueLevel[id] = 0; });
  return { matched: matched, trueLevel: trueLevel, unknown: unknown };
}

/* A gain never lifts a file's sample peak above full scale: at most
   -20 log10(peak) dB (no clipping at the output). */
function limitGainDb(gainDb, peak) {
  if (!(peak > 0)) return gainDb;
  return Math.min(gainDb, -20 * Math.log10(peak));
}

function decibelsToGain(db) { return Math.pow(10, db / 20); }

/* Playback position with a loop region [start, end): before the end it runs
   on; past the end it wraps back to the start, as a looping
   AudioBufferSourceNode does (Web Audio API, "loopStart"/"loopEnd"). */
function wrapPosition(position, loop) {
  if (!loop) return position;
  var length = loop.end - loop.start;
  if (!(length > 0) || position < loop.end) return position;
  return loop.start + ((position - loop.start) % length);
}

/* A path the page may load: relative, inside the page's folder (no scheme,
   no leading slash or backslash, no ".." segment). */
function isInsideFolder(path) {
  if (typeof path !== 'string' || path === '') return false;
  if (/^[a-zA-Z][a-zA-Z0-9+.-]*:/.test(path) || /^[\/\\]/.test(path)) return false;
  return path.split(/[\/\\]/).every(function (segment) { return segment !== '..'; });
}

/* The script beside a WAV that carries the same audio for the page. */
function pageAudioPath(wavPath) { return wavPath + '.js'; }

/* Linear interpolation of a response (dB) at a frequency, on log frequency. */
function responseAt(frequenciesHz, responseDb, hz) {
  if (frequenciesHz.length === 0) return NaN;
  if (hz <= frequenciesHz[0]) return responseDb[0];
  for (var i = 1; i < frequenciesHz.length; i += 1) {
    if (hz <= frequenciesHz[i]) {
      var low = Math.log(frequenciesHz[i - 1]);
      var t = (Math.log(hz) - low) / (Math.log(frequenciesHz[i]) - low);
      return responseDb[i - 1] + t * (responseDb[i] - responseDb[i - 1]);
    }
  }
  return responseDb[responseDb.length - 1];
}

var MINUS_SIGN = '\u2212';

function formatDb(db, digits) {
  if (typeof db !== 'number' || !isFinite(db)) return '\u2014';
  var places = digits === undefined ? 1 : digits;
  var fixed = Math.abs(db).toFixed(places);
  if (Number(fixed) === 0) return (0).toFixed(places) + ' dB';
  return (db < 0 ? MINUS_SIGN : '+') + fixed + ' dB';
}

function formatHz(hz) {
  if (typeof hz !== 'number' || !isFinite(hz)) return '\u2014';
  if (hz < 1000) return Math.round(hz) + ' Hz';
  var khz = hz / 1000;
  return khz.toFixed(khz < 10 ? 2 : 1) + ' kHz';
}

function formatSeconds(seconds) {
  return (isFinite(seconds) ? Math.max(0, seconds) : 0).toFixed(2) + ' s';
}

function formatProbability(probability) {
  if (probability < 0.001) return 'less than 0.1 %';
  return (probability * 100).toFixed(probability < 0.1 ? 1 : 0) + ' %';
}
`;

/** Names the math script defines, for tests and the page script. */
export const PAGE_MATH_FUNCTIONS = Object.freeze([
  'binomialTailProbability',
  'playbackGainsDb',
  'limitGainDb',
  'decibelsToGain',
  'wrapPosition',
  'isInsideFolder',
  'pageAudioPath',
  'responseAt',
  'formatDb',
  'formatHz',
  'formatSeconds',
  'formatProbability',
] as const);
