/**
 * The listening page's frequency-response plot, as script text inlined by
 * the page: the responses of the chosen wirings overlaid as inline SVG on a
 * log-frequency axis (20 Hz to 20 kHz) in dB relative to 100 Hz, each
 * resonant peak marked by a focusable dot, and a cursor whose readout gives
 * every curve's value (pointer, or arrow keys when the plot has focus).
 * Everything is built with createElementNS and textContent. Requires the
 * math script (responseAt, formatHz, formatDb).
 */
export const PAGE_PLOT_SCRIPT = String.raw`
function createResponsePlot(frequencies, describe) {
  var plotElement = document.getElementById('response-plot');
  var legendElement = document.getElementById('plot-legend');
  var readoutElement = document.getElementById('plot-readout');
  function text(element, value) { element.textContent = value; }

  var SVG = 'http://www.w3.org/2000/svg';
  var PLOT = { width: 760, height: 340, left: 56, right: 18, top: 14, bottom: 44, minHz: 20, maxHz: 20000 };
  var COLOURS = ['#0f766e', '#b4480b', '#4f46e5', '#a21caf', '#15803d', '#b91c1c', '#0369a1', '#854d0e'];
  var DASHES = ['', '7 4', '2 3', '10 3 2 3'];
  var FREQUENCY_TICKS = [20, 50, 100, 200, 500, 1000, 2000, 5000, 10000, 20000];
  var plotState = { hz: 1000, range: null };

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
  var shown = [];
  function plotted() { return shown; }

  /* Draw these wirings' responses (replacing what was drawn). */
  function draw(curves) {
    shown = curves.slice();
    var plot = plotElement;
    while (plot.firstChild) plot.removeChild(plot.firstChild);
    var legend = legendElement;
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
      marker.addEventListener('focus', function () { text(readoutElement, words); });
    });
    svg('line', { class: 'cursor', x1: xOf(plotState.hz), x2: xOf(plotState.hz), y1: PLOT.top, y2: PLOT.height - PLOT.bottom, id: 'plot-cursor' }, plot);
    showReadout();
  }

  function showReadout() {
    var curves = plotted();
    var cursor = document.getElementById('plot-cursor');
    if (cursor) { cursor.setAttribute('x1', xOf(plotState.hz)); cursor.setAttribute('x2', xOf(plotState.hz)); }
    if (curves.length === 0) { text(readoutElement, 'No wiring plotted yet: tick Plot on any rows.'); return; }
    text(readoutElement, 'At ' + formatHz(plotState.hz) + ': ' + curves.map(function (wiring) {
      return wiring.id + ' ' + formatDb(responseAt(frequencies, wiring.responseDb, plotState.hz));
    }).join(', '));
  }

  plotElement.addEventListener('pointermove', function (event) {
    var box = plotElement.getBoundingClientRect();
    plotState.hz = hzOf((event.clientX - box.left) / box.width * PLOT.width);
    showReadout();
  });
  plotElement.addEventListener('keydown', function (event) {
    var factor = Math.pow(2, 1 / 12);
    if (event.key === 'ArrowRight') plotState.hz = Math.min(PLOT.maxHz, plotState.hz * factor);
    else if (event.key === 'ArrowLeft') plotState.hz = Math.max(PLOT.minHz, plotState.hz / factor);
    else if (event.key === 'Home') plotState.hz = PLOT.minHz;
    else if (event.key === 'End') plotState.hz = PLOT.maxHz;
    else return;
    event.preventDefault();
    showReadout();
  });
  plotElement.addEventListener('focus', showReadout);

  return { draw: draw };
}
`;
