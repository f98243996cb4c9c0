/**
 * The blind test: the ABX method (D. L. Clark, "High-resolution subjective
 * testing using a double-blind comparator", J. Audio Eng. Soc. 30(5), 1982:
 * one hidden sample X that is one of two known ones) between two chosen wirings, laid out our own
 * way. Each round hides one of the two as the "mystery" sound
 * (crypto.getRandomValues); the listener hears the first, the second and the
 * mystery as often as they like through the page's player (same position,
 * level matched) and names which the mystery is. The tally comes with the
 * chance of scoring at least as well with a coin (one-sided binomial
 * probability). Answers are shown when the test is finished.
 */
import { binomialTailProbability, formatProbability } from './page-math.js';

/** Rounds to do before a score means much (at least 10 trials at 95 % confidence, as docs/sources.md lists for blind listening tests). */
export const SUGGESTED_ROUNDS = 10;
/** Below this chance a score is unlikely to be luck (the conventional 5 % significance level). */
export const LUCK_THRESHOLD = 0.05;

export type Side = 'first' | 'second';

export interface BlindTestHost {
  readonly listen: (id: string) => void;
  readonly stop: () => void;
  readonly describe: (id: string) => string;
  readonly changed: () => void;
}

export interface BlindTest {
  isRunning(): boolean;
  /** The words for what plays, while a test runs. */
  label(): string | null;
  involves(id: string): boolean;
  score(): { rounds: number; right: number; probability: number };
}

function byId<T extends HTMLElement>(id: string): T {
  return document.getElementById(id) as T;
}

export function createBlindTest(host: BlindTestHost): BlindTest {
  let running = false;
  let first = '';
  let second = '';
  let hidden: Side = 'first';
  let label: string | null = null;
  let rounds: { hidden: Side; answer: Side }[] = [];

  const randomSide = (): Side => {
    const bytes = new Uint8Array(1);
    crypto.getRandomValues(bytes);
    return ((bytes[0] as number) & 1) === 0 ? 'first' : 'second';
  };
  const score = (): { rounds: number; right: number; probability: number } => {
    const right = rounds.filter((round) => round.hidden === round.answer).length;
    return { rounds: rounds.length, right, probability: binomialTailProbability(right, rounds.length) };
  };

  function showScore(): void {
    const element = byId('blind-tally');
    const result = score();
    element.dataset['right'] = String(result.right);
    element.dataset['rounds'] = String(result.rounds);
    element.dataset['probability'] = String(result.probability);
    if (result.rounds === 0) {
      element.textContent = '';
      return;
    }
    let words = `Tally: ${result.right} right in ${result.rounds} rounds. A coin would score this well or better ${formatProbability(result.probability)} of the time. `;
    if (result.rounds < SUGGESTED_ROUNDS) words += `Keep going to ${SUGGESTED_ROUNDS} rounds before trusting it.`;
    else if (result.probability < LUCK_THRESHOLD) words += 'Luck is an unlikely explanation: you seem to hear a difference.';
    else words += 'Luck explains this well: to your ears the two may be the same.';
    element.textContent = words;
  }

  function nextRound(): void {
    hidden = randomSide();
    byId('blind-round').textContent = `Round ${rounds.length + 1}: which one is the mystery sound?`;
  }

  function start(): void {
    first = byId<HTMLSelectElement>('blind-first').value;
    second = byId<HTMLSelectElement>('blind-second').value;
    if (first === second) {
      byId('blind-tally').textContent = 'Pick two different wirings.';
      return;
    }
    running = true;
    rounds = [];
    byId('blind-answers').replaceChildren();
    byId('blind-rounds').hidden = false;
    showScore();
    nextRound();
    host.changed();
  }

  function hear(which: Side | 'mystery'): void {
    if (!running) return;
    label = which === 'mystery' ? 'the mystery sound' : `the ${which} wiring`;
    const side = which === 'mystery' ? hidden : which;
    host.listen(side === 'first' ? first : second);
    host.changed();
  }

  function answer(side: Side): void {
    if (!running) return;
    rounds.push({ hidden, answer: side });
    showScore();
    nextRound();
  }

  function finish(): void {
    if (!running) return;
    running = false;
    label = null;
    byId('blind-rounds').hidden = true;
    const list = byId('blind-answers');
    list.replaceChildren();
    rounds.forEach((round, index) => {
      const item = document.createElement('li');
      const hiddenId = round.hidden === 'first' ? first : second;
      item.textContent = `Round ${index + 1}: the mystery was the ${round.hidden} wiring (${host.describe(hiddenId)}); you named the ${round.answer}${round.hidden === round.answer ? ' \u2014 right.' : ' \u2014 not this time.'}`;
      item.className = round.hidden === round.answer ? 'right' : 'wrong';
      list.appendChild(item);
    });
    host.changed();
  }

  const on = (action: string, handler: () => void): void => {
    document.querySelector(`[data-action="${action}"]`)?.addEventListener('click', handler);
  };
  on('blind-start', start);
  on('blind-hear-first', () => hear('first'));
  on('blind-hear-second', () => hear('second'));
  on('blind-hear-mystery', () => hear('mystery'));
  on('blind-is-first', () => answer('first'));
  on('blind-is-second', () => answer('second'));
  on('blind-silence', host.stop);
  on('blind-finish', finish);

  return {
    isRunning: () => running,
    label: () => label,
    involves: (id) => running && (id === first || id === second),
    score,
  };
}
