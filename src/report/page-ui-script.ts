/**
 * The listening page's interface, as script text inlined by the page: rows,
 * sorting and filters, the transport (play, position, loop, level mode,
 * volume), the keyboard, the frequency-response plot and the blind test.
 * Every string from the report reaches the DOM through textContent or
 * setAttribute, never as markup. Requires the math, loader and player scripts.
 */
import { ABX_SIGNIFICANCE, RECOMMENDED_ABX_TRIALS } from './abx-settings.js';

export const PAGE_UI_SCRIPT = String.raw`
(function () {
  var RECOMMENDED_TRIALS = ${RECOMMENDED_ABX_TRIALS};
  var SIGNIFICANCE = ${ABX_SIGNIFICANCE};
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
  var ui = { matched: true, current: null, previous: null, blind: null, blindLabel: null, compared: [], sortKey: 'number', sortDirection: 1, scrubbing: false };

  function $(id) { return document.getElementById(id); }
  function text(element, value) { element.textContent = value; }

  var loader = createAudioLoader(report.render.sampleRateHz, function (id) {
    return id === player.currentId() || player.soundingIds().indexOf(id) >= 0 ||
      (ui.blind !== null && (id === ui.blind.a || id === ui.blind.b));
  });
  var player = createPlayer(loader, {
    sampleRateHz: report.render.sampleRateHz,
    volume: Number($('volume').value),
    gainDb: function (id, peak) {
      var table = ui.blind !== null || ui.matched ? gains.matched : gains.trueLevel;
      return limitGainDb(table[id] || 0, peak);
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
    if (ui.blind !== null) return 'Blind test: level matched, names hidden.';
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
    if (ui.blind !== null && ui.blindLabel) text($('now-label'), 'Blind test \u00b7 playing ' + ui.blindLabel);
    else if (wiring) text($('now-label'), describe(wiring));
    text($('level-note'), levelNote());
    var playing = player.isPlaying() || player.isStarting();
    var play = $('transport-play');
    play.setAttribute('aria-label', playing ? 'Pause' : 'Play');
    play.classList.toggle('is-playing', playing);
    rows.forEach(function (row, rowId) {
      var button = row.querySelector('[data-action="play"]');
      var active = ui.blind === null && rowId === ui.current;
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
    if (event === 'sound' && ui.blind === null) {
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
    ui.blindLabel = null;
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
    if (ui.blind === null) setCurrent(id);
    player.play(wiring).catch(showError);
  }

  tbody.addEventListener('click', function (event) {
    var button = event.target.closest('[data-action="play"]');
    if (!button) return;
    var id = button.closest('tr').getAttribute('data-wiring');
    if (ui.blind === null && id === ui.current && (player.isPlaying() || player.isStarting())) player.pause();
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
    if (inPlot || ui.blind !== null) return;
    if (target.closest('select, textarea, input:not([type="checkbox"])')) return;
    if (event.key === 'ArrowDown') { event.preventDefault(); step(1); }
    else if (event.key === 'ArrowUp') { event.preventDefault(); step(-1); }
  });

  /* ---------- frequency response plot ---------- */

  var SVG = 'http://www.w3.org/2000/svg';
  var PLOT = { width: 760, height: 340, left: 56, right: 18, top: 14, bottom: 44, minHz: 20, maxHz: 20000 };
  var COLOURS = ['#0f766e', '#b4480b', '#4f46e5', '#a21caf', '#15803d', '#b91c1c', '#0369a1', '#854d0e'];
  var DASHES = ['', '7 4', '2 3', '10 3 2 3'];
  var FREQUENCY_TICKS = [20, 50, 100, 200, 500, 1000, 2000, 5000, 10000, 20000];
  var plotState = { hz: 1000, range: null };
  var frequencies = report.responseFrequenciesHz;

  function svg(name, attributes, parent) {
    var element = document.createElementNS(SVG, name);
    Object.keys(attributes).forEach(function (key) { element.setAttribute(key, String(attributes[key])); });
    if (parent) parent.appendChild(element);
    return element;
  }
  function xOf(hz) {
    return PLOT.left + Math.log(hz / PLOT.minHz) / Math.log(PLOT.maxHz / PLOT.minHz) * (PLOT.width - PLOT.left - PLOT.right);
  }
  function hzOf(x) {
    var fraction = (x - PLOT.left) / (PLOT.width - PLOT.left - PLOT.right);
    return PLOT.minHz * Math.pow(PLOT.maxHz / PLOT.minHz, Math.max(0, Math.min(1, fraction)));
  }
  function yOf(db) {
    var range = plotState.range;
    return PLOT.top + (range.top - db) / (range.top - range.bottom) * (PLOT.height - PLOT.top - PLOT.bottom);
  }
  function frequencyLabel(hz) { return hz >= 1000 ? (hz / 1000) + 'k' : String(hz); }
  function plotted() { return ui.compared.map(function (id) { return byId.get(id); }).filter(Boolean); }

  function drawPlot() {
    var plot = $('response-plot');
    while (plot.firstChild) plot.removeChild(plot.firstChild);
    var curves = plotted();
    var legend = $('plot-legend');
    while (legend.firstChild) legend.removeChild(legend.firstChild);
    var all = [];
    curves.forEach(function (wiring) { wiring.responseDb.forEach(function (db) { if (isFinite(db)) all.push(db); }); });
    var top = all.length ? Math.ceil((Math.max.apply(null, all) + 1) / 6) * 6 : 12;
    var bottom = all.length ? Math.floor(Math.min.apply(null, all) / 6) * 6 : -36;
    plotState.range = { top: top, bottom: Math.max(bottom, top - 72) };
    var grid = svg('g', { class: 'grid' }, plot);
    FREQUENCY_TICKS.forEach(function (hz) {
      svg('line', { x1: xOf(hz), x2: xOf(hz), y1: PLOT.top, y2: PLOT.height - PLOT.bottom }, grid);
      var label = svg('text', { x: xOf(hz), y: PLOT.height - PLOT.bottom + 16, 'text-anchor': 'middle' }, grid);
      label.textContent = frequencyLabel(hz);
    });
    var dbStep = plotState.range.top - plotState.range.bottom > 42 ? 12 : 6;
    for (var db = plotState.range.bottom; db <= plotState.range.top; db += dbStep) {
      svg('line', { x1: PLOT.left, x2: PLOT.width - PLOT.right, y1: yOf(db), y2: yOf(db), class: db === 0 ? 'zero' : '' }, grid);
      var tick = svg('text', { x: PLOT.left - 6, y: yOf(db) + 4, 'text-anchor': 'end' }, grid);
      tick.textContent = (db > 0 ? '+' : db < 0 ? '\u2212' : '') + Math.abs(db);
    }
    var axisX = svg('text', { x: (PLOT.left + PLOT.width - PLOT.right) / 2, y: PLOT.height - 6, 'text-anchor': 'middle', class: 'axis' }, grid);
    axisX.textContent = 'frequency (Hz)';
    var axisY = svg('text', { x: 14, y: PLOT.top + (PLOT.height - PLOT.top - PLOT.bottom) / 2, 'text-anchor': 'middle', class: 'axis', transform: 'rotate(-90 14 ' + (PLOT.top + (PLOT.height - PLOT.top - PLOT.bottom) / 2) + ')' }, grid);
    axisY.textContent = 'dB relative to 100 Hz';
    var clip = svg('clipPath', { id: 'plot-clip' }, svg('defs', {}, plot));
    svg('rect', { x: PLOT.left, y: PLOT.top, width: PLOT.width - PLOT.left - PLOT.right, height: PLOT.height - PLOT.top - PLOT.bottom }, clip);
    var lines = svg('g', { 'clip-path': 'url(#plot-clip)' }, plot);
    curves.forEach(function (wiring, index) {
      var colour = COLOURS[index % COLOURS.length];
      var dash = DASHES[Math.floor(index / COLOURS.length) % DASHES.length];
      var points = [];
      frequencies.forEach(function (hz, i) {
        var value = wiring.responseDb[i];
        if (hz >= PLOT.minHz && hz <= PLOT.maxHz && isFinite(value)) points.push(xOf(hz).toFixed(1) + ',' + yOf(value).toFixed(1));
      });
      var path = svg('polyline', { points: points.join(' '), fill: 'none', stroke: colour, 'stroke-width': 2, class: 'curve', 'data-wiring': wiring.id }, lines);
      if (dash) path.setAttribute('stroke-dasharray', dash);
      var item = document.createElement('li');
      var swatch = svg('svg', { width: 28, height: 10, 'aria-hidden': 'true' }, item);
      var sample = svg('line', { x1: 0, x2: 28, y1: 5, y2: 5, stroke: colour, 'stroke-width': 3 }, swatch);
      if (dash) sample.setAttribute('stroke-dasharray', dash);
      var words = document.createElement('span');
      words.textContent = describe(wiring) + ' \u2014 peak ' + formatHz(wiring.resonanceHz) + (wiring.resonanceHz ? ', ' + formatDb(wiring.peakDb) : '');
      item.appendChild(words);
      legend.appendChild(item);
    });
    curves.forEach(function (wiring, index) {
      if (!(wiring.resonanceHz > 0)) return;
      var peakDb = isFinite(wiring.peakDb) ? wiring.peakDb : responseAt(frequencies, wiring.responseDb, wiring.resonanceHz);
      var marker = svg('circle', { cx: xOf(wiring.resonanceHz), cy: yOf(peakDb), r: 5, fill: COLOURS[index % COLOURS.length], class: 'peak-marker', tabindex: 0, 'data-wiring': wiring.id, role: 'img' }, plot);
      var words = wiring.id + ' resonant peak: ' + formatHz(wiring.resonanceHz) + ', ' + formatDb(peakDb) + ' above 100 Hz';
      marker.setAttribute('aria-label', words);
      svg('title', {}, marker).textContent = words;
      marker.addEventListener('focus', function () { text($('plot-readout'), words); });
    });
    svg('line', { class: 'cursor', x1: xOf(plotState.hz), x2: xOf(plotState.hz), y1: PLOT.top, y2: PLOT.height - PLOT.bottom, id: 'plot-cursor' }, plot);
    showReadout();
  }

  function showReadout() {
    var curves = plotted();
    var cursor = $('plot-cursor');
    if (cursor) { cursor.setAttribute('x1', xOf(plotState.hz)); cursor.setAttribute('x2', xOf(plotState.hz)); }
    if (curves.length === 0) { text($('plot-readout'), 'No wiring plotted yet: tick Plot on any rows.'); return; }
    text($('plot-readout'), 'At ' + formatHz(plotState.hz) + ': ' + curves.map(function (wiring) {
      return wiring.id + ' ' + formatDb(responseAt(frequencies, wiring.responseDb, plotState.hz));
    }).join(', '));
  }

  $('response-plot').addEventListener('pointermove', function (event) {
    var box = $('response-plot').getBoundingClientRect();
    plotState.hz = hzOf((event.clientX - box.left) / box.width * PLOT.width);
    showReadout();
  });
  $('response-plot').addEventListener('keydown', function (event) {
    var factor = Math.pow(2, 1 / 12);
    if (event.key === 'ArrowRight') plotState.hz = Math.min(PLOT.maxHz, plotState.hz * factor);
    else if (event.key === 'ArrowLeft') plotState.hz = Math.max(PLOT.minHz, plotState.hz / factor);
    else if (event.key === 'Home') plotState.hz = PLOT.minHz;
    else if (event.key === 'End') plotState.hz = PLOT.maxHz;
    else return;
    event.preventDefault();
    showReadout();
  });
  $('response-plot').addEventListener('focus', showReadout);

  function setCompared(ids) {
    ui.compared = ids.slice();
    rows.forEach(function (row, id) { row.querySelector('[data-action="compare"]').checked = ui.compared.indexOf(id) >= 0; });
    drawPlot();
  }
  document.querySelector('[data-action="clear-plot"]').addEventListener('click', function () { setCompared([]); });

  /* ---------- blind test (ABX) ---------- */

  var abx = { a: null, b: null, x: null, trials: [] };

  function pickAbxDefaults() {
    if (ui.blind !== null) return;
    var picks = ui.compared.length >= 2 ? ui.compared : wirings.map(function (wiring) { return wiring.id; });
    if (picks[0]) $('abx-a').value = picks[0];
    if (picks[1]) $('abx-b').value = picks[1];
  }

  function randomSide() {
    var bytes = new Uint8Array(1);
    window.crypto.getRandomValues(bytes);
    return (bytes[0] & 1) === 0 ? 'a' : 'b';
  }

  function abxScore() {
    var trials = abx.trials.length;
    var correct = abx.trials.filter(function (trial) { return trial.correct; }).length;
    return { trials: trials, correct: correct, probability: binomialTailProbability(correct, trials) };
  }

  function showScore() {
    var score = abxScore();
    if (score.trials === 0) { text($('abx-score'), ''); return; }
    var words = score.correct + ' of ' + score.trials + ' right. Chance of doing at least this well by guessing: ' + formatProbability(score.probability) + '. ';
    if (score.trials < RECOMMENDED_TRIALS) words += 'Do at least ' + RECOMMENDED_TRIALS + ' trials before reading much into it.';
    else if (score.probability < SIGNIFICANCE) words += 'Unlikely to be luck: you probably hear a difference.';
    else words += 'This could well be guessing: the two may sound the same to you.';
    text($('abx-score'), words);
    $('abx-score').setAttribute('data-correct', String(score.correct));
    $('abx-score').setAttribute('data-trials', String(score.trials));
    $('abx-score').setAttribute('data-probability', String(score.probability));
  }

  function nextTrial() {
    abx.x = randomSide();
    text($('abx-status'), 'Trial ' + (abx.trials.length + 1) + ': listen to A, B and X, then say which one X is.');
  }

  function abxPlay(which) {
    if (ui.blind === null) return;
    var id = which === 'x' ? abx[abx.x] : abx[which];
    ui.blindLabel = which.toUpperCase();
    var wiring = byId.get(id);
    var action = player.isPlaying() || player.isStarting() ? player.select(wiring) : player.play(wiring);
    action.catch(showError);
    updateLabels();
  }

  function abxAnswer(which) {
    if (ui.blind === null) return;
    abx.trials.push({ x: abx.x, answer: which, correct: which === abx.x });
    showScore();
    nextTrial();
  }

  function abxEnd() {
    if (ui.blind === null) return;
    ui.blind = null;
    ui.blindLabel = null;
    $('abx-trial').hidden = true;
    var log = $('abx-log');
    while (log.firstChild) log.removeChild(log.firstChild);
    abx.trials.forEach(function (trial, index) {
      var item = document.createElement('li');
      item.textContent = 'Trial ' + (index + 1) + ': X was ' + trial.x.toUpperCase() + ' (' + describe(byId.get(abx[trial.x])) + '); you said ' +
        trial.answer.toUpperCase() + (trial.correct ? ' \u2014 right.' : ' \u2014 wrong.');
      item.className = trial.correct ? 'right' : 'wrong';
      log.appendChild(item);
    });
    if (player.currentId()) { ui.current = player.currentId(); }
    player.refreshGains();
    updateLabels();
  }

  document.querySelector('[data-action="abx-start"]').addEventListener('click', function () {
    var a = $('abx-a').value;
    var b = $('abx-b').value;
    if (a === b) { text($('abx-score'), 'Choose two different wirings for A and B.'); return; }
    if (!byId.get(a).wav || !byId.get(b).wav) { text($('abx-score'), 'Both wirings must have been rendered.'); return; }
    abx = { a: a, b: b, x: null, trials: [] };
    ui.blind = { a: a, b: b };
    loader.load(byId.get(a)).catch(showError);
    loader.load(byId.get(b)).catch(showError);
    var log = $('abx-log');
    while (log.firstChild) log.removeChild(log.firstChild);
    $('abx-trial').hidden = false;
    player.refreshGains();
    showScore();
    nextTrial();
    updateLabels();
  });
  ['a', 'b', 'x'].forEach(function (which) {
    document.querySelector('[data-action="abx-play-' + which + '"]').addEventListener('click', function () { abxPlay(which); });
  });
  ['a', 'b'].forEach(function (which) {
    document.querySelector('[data-action="abx-answer-' + which + '"]').addEventListener('click', function () { abxAnswer(which); });
  });
  document.querySelector('[data-action="abx-stop"]').addEventListener('click', function () { player.pause(); });
  document.querySelector('[data-action="abx-end"]').addEventListener('click', abxEnd);

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
    abxScore: abxScore
  });
})();
`;
