/**
 * The comparison page's interface, as script text inlined by the page. It
 * drives the listening page's own loader, player and blind test
 * (page-loader-script.ts, page-player-script.ts, page-blind-script.ts) with
 * the comparison's sounds: one entry per wiring and set. Pressing another
 * set's button on a row while it plays switches sets at the same point in
 * the phrase (the player keeps one clock), at matched level unless the
 * listener asks for true level; the blind test hides which set is which.
 *
 * Every set's audio scripts call back with that set's own wiring id ("w9"
 * in both A and B), so the callback is wrapped: the page knows from
 * `document.currentScript` which file is calling and hands the loader the
 * entry id ("B:w9") it asked for.
 *
 * Every string from the report reaches the DOM through textContent or
 * setAttribute, never as markup. Requires the math, loader, player and
 * blind-test scripts.
 */
import { PAGE_AUDIO_CALLBACK } from './page-audio-file.js';

export const PAGE_COMPARISON_SCRIPT = String.raw`
(function () {
  var TICK_MS = 50;
  var data = JSON.parse(document.getElementById('comparison-data').textContent);
  var report = data.report;
  var gains = data.gains;
  var sets = report.sets;
  var byId = new Map();
  report.entries.forEach(function (entry) { byId.set(entry.id, entry); });
  var rowsByKey = new Map();
  report.rows.forEach(function (row) { rowsByKey.set(row.key, row); });
  var rowElements = Array.prototype.slice.call(document.querySelectorAll('tr[data-row]'));
  var ui = { matched: true, row: report.rows.length > 0 ? report.rows[0].key : null, set: 0, scrubbing: false };

  function $(id) { return document.getElementById(id); }
  function text(element, value) { element.textContent = value; }

  var loader = createAudioLoader(sets[0].render.sampleRateHz, function (id) {
    return id === player.currentId() || player.soundingIds().indexOf(id) >= 0 || blind.involves(id);
  });

  /* Audio scripts call back with their own set's wiring id: map the calling file to the entry. */
  var entryBySource = new Map();
  report.entries.forEach(function (entry) { if (entry.wav) entryBySource.set(pageAudioPath(entry.wav), entry.id); });
  var deliver = window.${PAGE_AUDIO_CALLBACK};
  window.${PAGE_AUDIO_CALLBACK} = function (id, base64) {
    var script = document.currentScript;
    var source = script ? script.getAttribute('src') : null;
    deliver(source && entryBySource.has(source) ? entryBySource.get(source) : id, base64);
  };

  var player = createPlayer(loader, {
    sampleRateHz: sets[0].render.sampleRateHz,
    volume: Number($('volume').value),
    gainDb: function (id, peak) {
      var table = blind.isRunning() || ui.matched ? gains.matched : gains.trueLevel;
      return limitGainDb(table[id] || 0, peak);
    }
  });

  function describe(entry) {
    return sets[entry.set].label + ' \u00b7 ' + sets[entry.set].name + ' \u00b7 ' + entry.wiringId + ' ' + entry.expression;
  }

  function showError(error) {
    var message = error && error.message ? error.message : String(error);
    if (/^could not read /.test(message)) {
      message = message.replace(/^could not read /, 'the audio file ') + ' is missing beside this page (keep the page and the set folders together, or render again)';
    }
    text($('now-detail'), 'Could not play: ' + message + '.');
  }

  var blind = createBlindTest({
    byId: byId,
    describe: describe,
    listen: function (entry) {
      var action = player.isPlaying() || player.isStarting() ? player.select(entry) : player.play(entry);
      action.catch(showError);
    },
    stop: function () { player.pause(); },
    preload: function (entry) { loader.load(entry).catch(showError); },
    changed: function () { player.refreshGains(); updateLabels(); }
  });

  function entryOf(key, set) {
    var row = rowsByKey.get(key);
    return row ? byId.get(row.entries[set]) : null;
  }

  function levelNote() {
    if (blind.isRunning()) return 'Blind test: level matched, sets hidden.';
    var entry = entryOf(ui.row, ui.set);
    var words = ui.matched ? 'Level matched: you hear the sound, not the loudness. ' : 'True level. ';
    if (!entry) return words;
    words += 'At true level this is ' + formatDb(entry.levelDb) + ' against ' + sets[0].label + '\u2019s average single coil';
    var baseline = entryOf(ui.row, 0);
    if (ui.set !== 0 && baseline && isFinite(baseline.levelDb) && isFinite(entry.levelDb)) {
      var difference = entry.levelDb - baseline.levelDb;
      words += ', ' + Math.abs(difference).toFixed(1) + ' dB ' + (difference >= 0 ? 'louder' : 'quieter') + ' than on ' + sets[0].label;
    }
    return words + '.';
  }

  function updateLabels() {
    var entry = entryOf(ui.row, ui.set);
    if (blind.isRunning() && blind.label()) text($('now-label'), 'Blind test \u00b7 playing ' + blind.label());
    else if (entry) text($('now-label'), describe(entry));
    text($('level-note'), levelNote());
    var playing = player.isPlaying() || player.isStarting();
    var play = $('transport-play');
    play.setAttribute('aria-label', playing ? 'Pause' : 'Play');
    play.classList.toggle('is-playing', playing);
    rowElements.forEach(function (element) {
      var key = element.getAttribute('data-row');
      var current = !blind.isRunning() && key === ui.row;
      if (current) element.setAttribute('aria-current', 'true'); else element.removeAttribute('aria-current');
      Array.prototype.forEach.call(element.querySelectorAll('[data-action="play-set"]'), function (button) {
        var on = current && Number(button.getAttribute('data-set')) === ui.set;
        button.setAttribute('aria-pressed', on && playing ? 'true' : 'false');
        button.classList.toggle('is-playing', on && playing);
        button.classList.toggle('is-current', on);
      });
    });
  }

  function updateTime() {
    player.tick();
    var duration = player.duration() || sets[0].render.durationS;
    var position = player.position();
    text($('time'), formatSeconds(position) + ' / ' + formatSeconds(duration));
    if (!ui.scrubbing) { $('scrub').max = String(duration); $('scrub').value = String(position); }
  }

  player.onChange(function (event) {
    if (event === 'loading') text($('now-detail'), 'loading\u2026');
    if (event === 'sound' || event === 'pause' || event === 'ended' || event === 'error') text($('now-detail'), '');
    updateLabels();
    updateTime();
  });

  /* Sound the given row on the given set: switching at the same place if something plays. */
  function sound(key, set) {
    var entry = entryOf(key, set);
    if (!entry) return;
    blind.clearLabel();
    ui.row = key;
    ui.set = set;
    var action = player.isPlaying() || player.isStarting() ? player.select(entry) : player.play(entry);
    action.catch(showError);
    sets.forEach(function (_, other) { var twin = entryOf(key, other); if (twin && twin.wav && other !== set) loader.load(twin).catch(function () {}); });
    updateLabels();
  }

  document.querySelector('#comparison-table tbody').addEventListener('click', function (event) {
    var button = event.target.closest('[data-action]');
    if (!button) return;
    var key = button.closest('tr').getAttribute('data-row');
    var action = button.getAttribute('data-action');
    if (action === 'play-set') {
      var set = Number(button.getAttribute('data-set'));
      if (!blind.isRunning() && key === ui.row && set === ui.set && (player.isPlaying() || player.isStarting())) player.pause();
      else sound(key, set);
    } else if (action === 'blind-row') {
      var row = rowsByKey.get(key);
      blind.pickDefaults([row.entries[0], row.entries[Math.min(1, row.entries.length - 1)]]);
      $('blind').scrollIntoView({ block: 'start' });
    }
  });

  function togglePlayback() {
    if (player.isPlaying() || player.isStarting()) { player.pause(); return; }
    var entry = entryOf(ui.row, ui.set);
    if (entry) player.play(entry).catch(showError);
  }

  $('transport-play').disabled = false;
  $('transport-play').addEventListener('click', togglePlayback);
  $('scrub').addEventListener('input', function () { ui.scrubbing = true; player.seek(Number($('scrub').value)); updateTime(); });
  $('scrub').addEventListener('change', function () { ui.scrubbing = false; });
  $('match-level').addEventListener('change', function () {
    ui.matched = $('match-level').checked;
    player.refreshGains();
    updateLabels();
  });
  $('volume').addEventListener('input', function () { player.setVolume(Number($('volume').value)); });

  /* Keys: Space plays and pauses; arrows change wiring on the same set; A, B, C … switch sets on the same wiring. */
  document.addEventListener('keydown', function (event) {
    if (event.altKey || event.ctrlKey || event.metaKey || blind.isRunning()) return;
    var target = event.target;
    if (target.closest && target.closest('select, textarea, input:not([type="checkbox"]):not([type="range"])')) return;
    if (event.key === ' ' && !(target.closest && target.closest('button'))) { event.preventDefault(); togglePlayback(); return; }
    var keys = report.rows.map(function (row) { return row.key; });
    var index = keys.indexOf(ui.row);
    if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
      event.preventDefault();
      var next = keys[Math.max(0, Math.min(keys.length - 1, index + (event.key === 'ArrowDown' ? 1 : -1)))];
      if (player.isPlaying() || player.isStarting()) sound(next, ui.set); else { ui.row = next; updateLabels(); }
      return;
    }
    var letter = event.key.length === 1 ? event.key.toUpperCase() : '';
    var set = sets.findIndex(function (candidate) { return candidate.label === letter; });
    if (set >= 0 && ui.row) { event.preventDefault(); sound(ui.row, set); }
  });

  if (report.rows.length > 0) blind.pickDefaults([report.rows[0].entries[0], report.rows[0].entries[Math.min(1, report.rows[0].entries.length - 1)]]);
  updateLabels();
  updateTime();
  setInterval(updateTime, TICK_MS);

  /* Read-only view for tests and the curious. */
  window.coilbenchComparison = Object.freeze({
    position: function () { return player.position(); },
    isPlaying: function () { return player.isPlaying(); },
    currentId: function () { return player.currentId(); },
    soundingIds: function () { return player.soundingIds(); },
    abxScore: function () { return blind.score(); }
  });
})();
`;
