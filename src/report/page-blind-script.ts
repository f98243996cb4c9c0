/**
 * The listening page's blind test, as script text inlined by the page: ABX
 * trials between two chosen wirings. Each trial hides one of A or B as X
 * (crypto.getRandomValues); the listener plays A, B and X through the page's
 * player, which keeps the position and matches levels while a test runs,
 * and answers. The running score comes with the probability of doing at
 * least as well by guessing (binomialTailProbability). Answers are revealed
 * when the test ends. Requires the math script.
 */
import { ABX_SIGNIFICANCE, RECOMMENDED_ABX_TRIALS } from './abx-settings.js';

export const PAGE_BLIND_SCRIPT = String.raw`
/* options: byId (Map of wirings), describe(wiring), listen(wiring) plays it,
   stop(), preload(wiring), changed() after the test starts, plays or ends. */
function createBlindTest(options) {
  var RECOMMENDED_TRIALS = ${RECOMMENDED_ABX_TRIALS};
  var SIGNIFICANCE = ${ABX_SIGNIFICANCE};
  var state = { running: false, a: null, b: null, x: null, label: null, trials: [] };
  function $(id) { return document.getElementById(id); }
  function text(element, value) { element.textContent = value; }
  function clearLog() { var log = $('abx-log'); while (log.firstChild) log.removeChild(log.firstChild); }

  function randomSide() {
    var bytes = new Uint8Array(1);
    window.crypto.getRandomValues(bytes);
    return (bytes[0] & 1) === 0 ? 'a' : 'b';
  }

  function score() {
    var trials = state.trials.length;
    var correct = state.trials.filter(function (trial) { return trial.correct; }).length;
    return { trials: trials, correct: correct, probability: binomialTailProbability(correct, trials) };
  }

  function showScore() {
    var result = score();
    var element = $('abx-score');
    if (result.trials === 0) { text(element, ''); return; }
    var words = 'Tally: ' + result.correct + ' right in ' + result.trials + ' rounds. A coin would score this well or better ' + formatProbability(result.probability) + ' of the time. ';
    if (result.trials < RECOMMENDED_TRIALS) words += 'Keep going to ' + RECOMMENDED_TRIALS + ' rounds before trusting it.';
    else if (result.probability < SIGNIFICANCE) words += 'Luck is an unlikely explanation: you seem to hear a difference.';
    else words += 'Luck explains this well: to your ears the two may be the same.';
    text(element, words);
    element.setAttribute('data-correct', String(result.correct));
    element.setAttribute('data-trials', String(result.trials));
    element.setAttribute('data-probability', String(result.probability));
  }

  function nextTrial() {
    state.x = randomSide();
    text($('abx-status'), 'Round ' + (state.trials.length + 1) + ': which one is the mystery sound?');
  }

  function start() {
    var a = $('abx-a').value;
    var b = $('abx-b').value;
    if (a === b) { text($('abx-score'), 'Pick two different wirings.'); return; }
    if (!options.byId.get(a).wav || !options.byId.get(b).wav) { text($('abx-score'), 'Both wirings must have been rendered.'); return; }
    state = { running: true, a: a, b: b, x: null, label: null, trials: [] };
    options.preload(options.byId.get(a));
    options.preload(options.byId.get(b));
    clearLog();
    $('abx-trial').hidden = false;
    showScore();
    nextTrial();
    options.changed();
  }

  function play(which) {
    if (!state.running) return;
    state.label = which === 'x' ? 'the mystery sound' : which === 'a' ? 'the first wiring' : 'the second wiring';
    options.listen(options.byId.get(which === 'x' ? state[state.x] : state[which]));
    options.changed();
  }

  function answer(which) {
    if (!state.running) return;
    state.trials.push({ x: state.x, answer: which, correct: which === state.x });
    showScore();
    nextTrial();
  }

  function end() {
    if (!state.running) return;
    state.running = false;
    state.label = null;
    $('abx-trial').hidden = true;
    clearLog();
    state.trials.forEach(function (trial, index) {
      var item = document.createElement('li');
      item.textContent = 'Round ' + (index + 1) + ': the mystery was the ' + (trial.x === 'a' ? 'first' : 'second') + ' wiring (' + options.describe(options.byId.get(state[trial.x])) +
        '); you named the ' + (trial.answer === 'a' ? 'first' : 'second') + (trial.correct ? ' \u2014 right.' : ' \u2014 not this time.');
      item.className = trial.correct ? 'right' : 'wrong';
      $('abx-log').appendChild(item);
    });
    options.changed();
  }

  document.querySelector('[data-action="abx-start"]').addEventListener('click', start);
  ['a', 'b', 'x'].forEach(function (which) {
    document.querySelector('[data-action="abx-play-' + which + '"]').addEventListener('click', function () { play(which); });
  });
  ['a', 'b'].forEach(function (which) {
    document.querySelector('[data-action="abx-answer-' + which + '"]').addEventListener('click', function () { answer(which); });
  });
  document.querySelector('[data-action="abx-stop"]').addEventListener('click', function () { options.stop(); });
  document.querySelector('[data-action="abx-end"]').addEventListener('click', end);

  /* Offer these wirings as A and B (when no test runs). */
  function pickDefaults(ids) {
    if (state.running) return;
    if (ids[0]) $('abx-a').value = ids[0];
    if (ids[1]) $('abx-b').value = ids[1];
  }

  return {
    isRunning: function () { return state.running; },
    label: function () { return state.label; },
    clearLabel: function () { state.label = null; },
    involves: function (id) { return state.running && (id === state.a || id === state.b); },
    score: score,
    pickDefaults: pickDefaults
  };
}
`;
