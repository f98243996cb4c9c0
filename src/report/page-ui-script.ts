/**
 * The listening page's interface, as script text inlined by the page: rows,
 * sorting and filters, the transport (play, position, loop, level mode,
 * volume) and the keyboard, joined to the plot and the blind test.
 * Every string from the report reaches the DOM through textContent or
 * setAttribute, never as markup. Requires the math, loader, player, plot and
 * blind-test scripts.
 */
export const PAGE_UI_SCRIPT = String.raw`
(function () {
  var TICK_MS = 50;
  var report = JSON.parse(document.getElementById('report-data').textContent);
  var wirings = report.wirings;
  var byId = new Map();
  wirings.forEach(function (wiring) { byId.set(wiring.id, wiring); });
  var rows = new Map();
  Array.prototype.forEach.call(document.querySelectorAll('tr[data-wiring]'), function (row) {
    rows.set(row.getAttribute('data-wiring'), row);
  });
  var tbody = document.querySelector('#wiring-table tbody');
  var gains = playbackGainsDb(wirings, report.render);
  var ui = { matched: true, current: null, previous: null, compared: [], sortKey: 'number', sortDirection: 1, scrubbing: false };

  function $(id) { return document.getElementById(id); }
  function text(element, value) { element.textContent = value; }

  var loader = createAudioLoader(report.render.sampleRateHz, function (id) {
    return id === player.currentId() || player.soundingIds().indexOf(id) >= 0 ||
      blind.involves(id);
  });
  var player = createPlayer(loader, {
    sampleRateHz: report.render.sampleRateHz,
    volume: Number($('volume').value),
    gainDb: function (id, peak) {
      var table = blind.isRunning() || ui.matched ? gains.matched : gains.trueLevel;
      return limitGainDb(table[id] || 0, peak);
    }
  });

  var blind = createBlindTest({
    byId: byId,
    describe: describe,
    listen: function (wiring) {
      var action = player.isPlaying() || player.isStarting() ? player.select(wiring) : player.play(wiring);
      action.catch(showError);
    },
    stop: function () { player.pause(); },
    preload: function (wiring) { loader.load(wiring).catch(showError); },
    changed: function () {
      if (!blind.isRunning() && player.currentId()) ui.current = player.currentId();
      player.refreshGains();
      updateLabels();
    }
  });

  /* ---------- status and labels ---------- */

  function describe(wiring) { return wiring.id + ' \u00b7 ' + wiring.description; }

  function showError(error) {
    var message = error && error.message ? error.message : String(error);
    if (/^could not read /.test(message)) {
      message = message.replace(/^could not read /, 'the audio file ') + ' is missing beside this page (keep the page and its wav folder together, or render again)';
    }
    text($('now-detail'), 'Could not play: ' + message + '.');
  }

  function levelNote() {
    var wiring = byId.get(player.currentId() || ui.current || '');
    if (blind.isRunning()) return 'Blind test: level matched, names hidden.';
    if (!wiring) return ui.matched ? 'Level matched.' : 'True level.';
    var note = (ui.matched ? 'Level matched. ' : 'True level. ') + 'This wiring at true level: ' + formatDb(wiring.levelDb) + ' against the average single coil';
    var before = ui.previous ? byId.get(ui.previous) : null;
    if (before && before.id !== wiring.id && isFinite(wiring.levelDb) && isFinite(before.levelDb)) {
      var difference = wiring.levelDb - before.levelDb;
      note += '; ' + Math.abs(difference).toFixed(1) + ' dB ' + (difference >= 0 ? 'louder' : 'quieter') + ' than ' + before.id;
    }
    if (gains.unknown.indexOf(wiring.id) >= 0) note += ' (loudness unknown: not matched)';
    var entry = loader.peek(wiring.id);
    var wanted = (ui.matched ? gains.matched : gains.trueLevel)[wiring.id] || 0;
    if (entry && limitGainDb(wanted, entry.peak) < wanted - 0.05) {
      note += ' (raised only ' + formatDb(limitGainDb(wanted, entry.peak)) + ' of ' + formatDb(wanted) + ' to stay below full scale: a little quieter than the others)';
    }
    return note + '.';
  }

  function updateLabels() {
    var id = player.currentId() || ui.current;
    var wiring = id ? byId.get(id) : null;
    if (blind.isRunning() && blind.label()) text($('now-label'), 'Blind test \u00b7 playing ' + blind.label());
    else if (wiring) text($('now-label'), describe(wiring));
    text($('level-note'), levelNote());
    var playing = player.isPlaying() || player.isStarting();
    var play = $('transport-play');
    play.setAttribute('aria-label', playing ? 'Pause' : 'Play');
    play.classList.toggle('is-playing', playing);
    rows.forEach(function (row, rowId) {
      var button = row.querySelector('[data-action="play"]');
      var active = !blind.isRunning() && rowId === ui.current;
      if (active) row.setAttribute('aria-current', 'true'); else row.removeAttribute('aria-current');
      button.setAttribute('aria-pressed', active && playing ? 'true' : 'false');
      button.classList.toggle('is-playing', active && playing);
    });
  }

  function updateTime() {
    player.tick();
    var duration = player.duration() || report.render.durationS;
    var position = player.position();
    text($('time'), formatSeconds(position) + ' / ' + formatSeconds(duration));
    if (!ui.scrubbing) { $('scrub').max = String(duration); $('scrub').value = String(position); }
  }

  player.onChange(function (event) {
    if (event === 'sound' && !blind.isRunning()) {
      var id = player.currentId();
      if (id !== ui.current) { ui.previous = ui.current; ui.current = id; }
    }
    if (event === 'error') text($('now-detail'), '');
    if (event === 'loading') text($('now-detail'), 'loading\u2026');
    if (event === 'sound' || event === 'pause' || event === 'ended') text($('now-detail'), '');
    updateLabels();
    updateTime();
  });

  /* ---------- playing ---------- */

  function setCurrent(id) {
    if (id !== ui.current) { ui.previous = ui.current; ui.current = id; }
    updateLabels();
  }

  function visibleRows() {
    return Array.prototype.filter.call(tbody.rows, function (row) { return !row.hidden; });
  }

  function preloadAround(id) {
    var list = visibleRows();
    var index = list.findIndex(function (row) { return row.getAttribute('data-wiring') === id; });
    [index - 1, index + 1].forEach(function (neighbour) {
      var row = list[neighbour];
      var wiring = row ? byId.get(row.getAttribute('data-wiring')) : null;
      if (wiring && wiring.wav) loader.load(wiring).catch(function () {});
    });
  }

  function playWiring(id) {
    var wiring = byId.get(id);
    if (!wiring) return;
    blind.clearLabel();
    setCurrent(id);
    var action = player.isPlaying() || player.isStarting() ? player.select(wiring) : player.play(wiring);
    action.catch(showError);
    preloadAround(id);
  }

  function togglePlayback() {
    if (player.isPlaying() || player.isStarting()) { player.pause(); return; }
    var id = ui.current || player.currentId();
    if (!id) { var first = visibleRows()[0]; id = first ? first.getAttribute('data-wiring') : null; }
    if (!id) return;
    var wiring = byId.get(id);
    if (!blind.isRunning()) setCurrent(id);
    player.play(wiring).catch(showError);
  }

  tbody.addEventListener('click', function (event) {
    var button = event.target.closest('[data-action="play"]');
    if (!button) return;
    var id = button.closest('tr').getAttribute('data-wiring');
    if (!blind.isRunning() && id === ui.current && (player.isPlaying() || player.isStarting())) player.pause();
    else playWiring(id);
  });

  tbody.addEventListener('change', function (event) {
    var box = event.target.closest('[data-action="compare"]');
    if (!box) return;
    var id = box.closest('tr').getAttribute('data-wiring');
    ui.compared = ui.compared.filter(function (other) { return other !== id; });
    if (box.checked) {
      ui.compared.push(id);
      var wiring = byId.get(id);
      if (wiring && wiring.wav) loader.load(wiring).catch(function () {});
    }
    drawPlot();
    pickAbxDefaults();
  });

  $('transport-play').disabled = false;
  $('transport-play').addEventListener('click', togglePlayback);

  $('scrub').addEventListener('input', function () { ui.scrubbing = true; player.seek(Number($('scrub').value)); updateTime(); });
  $('scrub').addEventListener('change', function () { ui.scrubbing = false; });

  function applyLoop() {
    var start = Number($('loop-start').value);
    var end = Number($('loop-end').value);
    if (!$('loop-on').checked) { player.setLoop(null); return; }
    if (!(end > start)) { text($('now-detail'), 'The loop must end after it starts.'); player.setLoop(null); return; }
    player.setLoop({ start: start, end: end });
  }
  $('loop-on').addEventListener('change', applyLoop);
  $('loop-start').addEventListener('change', applyLoop);
  $('loop-end').addEventListener('change', applyLoop);
  document.querySelector('[data-action="loop-start-here"]').addEventListener('click', function () {
    $('loop-start').value = player.position().toFixed(2); applyLoop();
  });
  document.querySelector('[data-action="loop-end-here"]').addEventListener('click', function () {
    $('loop-end').value = player.position().toFixed(2); applyLoop();
  });

  $('match-level').addEventListener('change', function () {
    ui.matched = $('match-level').checked;
    player.refreshGains();
    updateLabels();
  });
  $('volume').addEventListener('input', function () { player.setVolume(Number($('volume').value)); });

  /* ---------- sorting and filtering ---------- */

  var TOPOLOGY_RANK = { single: 0, series: 1, parallel: 2, 'series-parallel': 3 };
  var SORT_VALUES = {
    number: function (w) { return w.number; },
    description: function (w) { return w.description; },
    coils: function (w) { return w.coils.length; },
    topology: function (w) { return TOPOLOGY_RANK[w.topology]; },
    phase: function (w) { return w.outOfPhase.length; },
    level: function (w) { return w.levelDb; },
    brightness: function (w) { return w.centroidHz; },
    peak: function (w) { return w.resonanceHz; },
    hum: function (w) { return typeof w.humDb === 'number' && isFinite(w.humDb) ? w.humDb : -Infinity; }
  };

  function compareBy(key, direction) {
    var value = SORT_VALUES[key];
    return function (a, b) {
      var x = value(a);
      var y = value(b);
      var xMissing = x === null || x === undefined || (typeof x === 'number' && isNaN(x));
      var yMissing = y === null || y === undefined || (typeof y === 'number' && isNaN(y));
      if (xMissing !== yMissing) return xMissing ? 1 : -1;
      var order = 0;
      if (!xMissing) order = typeof x === 'string' ? x.localeCompare(y) : (x < y ? -1 : x > y ? 1 : 0);
      return order * direction || a.number - b.number;
    };
  }

  function sortRows(key, direction) {
    ui.sortKey = key;
    ui.sortDirection = direction;
    var ordered = wirings.slice().sort(compareBy(key, direction));
    var fragment = document.createDocumentFragment();
    ordered.forEach(function (wiring) { var row = rows.get(wiring.id); if (row) fragment.appendChild(row); });
    tbody.appendChild(fragment);
    Array.prototype.forEach.call(document.querySelectorAll('#wiring-table th'), function (heading) {
      var button = heading.querySelector('[data-sort]');
      if (!button) return;
      if (button.getAttribute('data-sort') === key) heading.setAttribute('aria-sort', direction > 0 ? 'ascending' : 'descending');
      else heading.removeAttribute('aria-sort');
    });
  }

  Array.prototype.forEach.call(document.querySelectorAll('[data-sort]'), function (button) {
    button.addEventListener('click', function () {
      var key = button.getAttribute('data-sort');
      sortRows(key, key === ui.sortKey ? -ui.sortDirection : 1);
    });
  });

  function applyFilters() {
    var coilRules = Array.prototype.map.call(document.querySelectorAll('[data-filter-coil]'), function (select) {
      return { id: select.getAttribute('data-filter-coil'), rule: select.value };
    });
    var count = $('filter-count').value;
    var topology = $('filter-topology').value;
    var phase = $('filter-phase').value;
    var quiet = $('filter-quiet').checked;
    var shown = 0;
    wirings.forEach(function (wiring) {
      var visible = coilRules.every(function (coil) {
        var used = wiring.coils.indexOf(coil.id) >= 0;
        return coil.rule === 'any' || (coil.rule === 'used') === used;
      });
      if (count !== 'any' && wiring.coils.length !== Number(count)) visible = false;
      if (topology !== 'any' && wiring.topology !== topology) visible = false;
      if (phase === 'in' && wiring.outOfPhase.length > 0) visible = false;
      if (phase === 'out' && wiring.outOfPhase.length === 0) visible = false;
      if (quiet && !wiring.humCancelling) visible = false;
      var row = rows.get(wiring.id);
      if (row) row.hidden = !visible;
      if (visible) shown += 1;
    });
    text($('shown-count'), 'Showing ' + shown + ' of ' + wirings.length);
  }

  $('filters').addEventListener('change', applyFilters);
  $('filters').addEventListener('submit', function (event) { event.preventDefault(); });
  document.querySelector('[data-action="reset-filters"]').addEventListener('click', function () {
    $('filters').reset();
    applyFilters();
  });
  document.querySelector('[data-action="quiet-only"]').addEventListener('click', function () {
    $('filter-quiet').checked = true;
    applyFilters();
    $('wirings').scrollIntoView({ block: 'start' });
  });

  /* ---------- keyboard ---------- */

  function isFormControl(element) {
    return !!element.closest('input, select, textarea, button, a, summary, [contenteditable="true"]');
  }

  function step(delta) {
    var list = visibleRows();
    if (list.length === 0) return;
    var index = list.findIndex(function (row) { return row.getAttribute('data-wiring') === ui.current; });
    var next = list[index < 0 ? 0 : Math.max(0, Math.min(list.length - 1, index + delta))];
    var id = next.getAttribute('data-wiring');
    if (player.isPlaying() || player.isStarting()) playWiring(id);
    else { setCurrent(id); preloadAround(id); var wiring = byId.get(id); if (wiring.wav) loader.load(wiring).catch(function () {}); }
    var button = next.querySelector('[data-action="play"]');
    if (button) button.focus({ preventScroll: true });
    next.scrollIntoView({ block: 'nearest' });
  }

  document.addEventListener('keydown', function (event) {
    if (event.altKey || event.ctrlKey || event.metaKey) return;
    var target = event.target;
    var inPlot = target.closest && target.closest('#response-plot');
    if (event.key === ' ' && !inPlot && !isFormControl(target)) { event.preventDefault(); togglePlayback(); return; }
    if (event.key === ' ' && inPlot) { event.preventDefault(); togglePlayback(); return; }
    if (inPlot || blind.isRunning()) return;
    if (target.closest('select, textarea, input:not([type="checkbox"])')) return;
    if (event.key === 'ArrowDown') { event.preventDefault(); step(1); }
    else if (event.key === 'ArrowUp') { event.preventDefault(); step(-1); }
  });

  /* ---------- frequency response plot ---------- */

  var plot = createResponsePlot(report.responseFrequenciesHz, describe);
  function drawPlot() { plot.draw(ui.compared.map(function (id) { return byId.get(id); }).filter(Boolean)); }

  function setCompared(ids) {
    ui.compared = ids.slice();
    rows.forEach(function (row, id) { row.querySelector('[data-action="compare"]').checked = ui.compared.indexOf(id) >= 0; });
    drawPlot();
  }
  document.querySelector('[data-action="clear-plot"]').addEventListener('click', function () { setCompared([]); });

  /* ---------- blind test (ABX) ---------- */

  function pickAbxDefaults() {
    blind.pickDefaults(ui.compared.length >= 2 ? ui.compared : wirings.map(function (wiring) { return wiring.id; }));
  }

  /* ---------- start ---------- */

  setCompared(wirings.filter(function (wiring) { return wiring.topology === 'single'; }).slice(0, 4).map(function (wiring) { return wiring.id; }));
  pickAbxDefaults();
  applyFilters();
  updateLabels();
  updateTime();
  setInterval(updateTime, TICK_MS);

  /* Read-only view for tests and the curious. */
  window.coilbenchPage = Object.freeze({
    position: function () { return player.position(); },
    isPlaying: function () { return player.isPlaying(); },
    currentId: function () { return player.currentId(); },
    soundingIds: function () { return player.soundingIds(); },
    abxScore: function () { return blind.score(); }
  });
})();
`;
