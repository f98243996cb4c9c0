/**
 * The list of every wiring, virtualised: only the rows in view (and a few
 * either side) exist in the document, so 9,997 wirings scroll as smoothly as
 * 47. Rows are fixed-height; a spacer gives the scroll range. Every text
 * reaches the document through textContent, never as markup.
 */
import { matchesSearch } from './page-math.js';

/** Height of one row, CSS px (matches `.wiring-row` in the page style). */
export const ROW_HEIGHT_PX = 34;
/** Rows made beyond each edge of the view, so a fast scroll shows no gap (our choice). */
const OVERSCAN_ROWS = 8;

export interface ListRow {
  readonly id: string;
  readonly number: number;
  readonly expression: string;
  /** Cells after the expression, plain text. */
  readonly cells: readonly string[];
  /** Text searched: expression, words, coil names. */
  readonly searchText: string;
}

export interface WiringList {
  /** Show only rows matching `query` (every word must appear). Returns how many match. */
  filter(query: string): number;
  /** Mark the row playing, scroll it into view when asked. */
  setCurrent(id: string | null, reveal: boolean): void;
  /** Ids of the rows shown, in order. */
  shown(): readonly string[];
  refresh(): void;
}

export interface ListHandlers {
  readonly play: (id: string) => void;
  readonly plot: (id: string, on: boolean) => void;
  readonly plotted: (id: string) => boolean;
}

export function createWiringList(viewport: HTMLElement, rows: readonly ListRow[], handlers: ListHandlers): WiringList {
  const spacer = document.createElement('div');
  spacer.className = 'list-spacer';
  viewport.appendChild(spacer);
  let shownRows: readonly ListRow[] = rows;
  let current: string | null = null;
  const made = new Map<string, HTMLElement>();

  function makeRow(row: ListRow): HTMLElement {
    const element = document.createElement('div');
    element.className = 'wiring-row';
    element.setAttribute('role', 'listitem');
    element.dataset['wiring'] = row.id;
    const play = document.createElement('button');
    play.type = 'button';
    play.className = 'row-play';
    play.dataset['action'] = 'play';
    play.setAttribute('aria-label', `Play ${row.expression}`);
    play.addEventListener('click', () => handlers.play(row.id));
    const number = document.createElement('span');
    number.className = 'cell number';
    number.textContent = String(row.number);
    const expression = document.createElement('code');
    expression.className = 'cell expression';
    expression.textContent = row.expression;
    element.append(play, number, expression);
    for (const text of row.cells) {
      const cell = document.createElement('span');
      cell.className = 'cell';
      cell.textContent = text;
      element.appendChild(cell);
    }
    const label = document.createElement('label');
    label.className = 'cell plot';
    const box = document.createElement('input');
    box.type = 'checkbox';
    box.dataset['action'] = 'plot';
    box.addEventListener('change', () => handlers.plot(row.id, box.checked));
    label.append(box, ' plot');
    element.appendChild(label);
    return element;
  }

  function draw(): void {
    spacer.style.height = `${shownRows.length * ROW_HEIGHT_PX}px`;
    const first = Math.max(0, Math.floor(viewport.scrollTop / ROW_HEIGHT_PX) - OVERSCAN_ROWS);
    const last = Math.min(shownRows.length, Math.ceil((viewport.scrollTop + viewport.clientHeight) / ROW_HEIGHT_PX) + OVERSCAN_ROWS);
    const wanted = new Set<string>();
    for (let index = first; index < last; index += 1) {
      const row = shownRows[index] as ListRow;
      wanted.add(row.id);
      let element = made.get(row.id);
      if (!element) {
        element = makeRow(row);
        made.set(row.id, element);
        spacer.appendChild(element);
      }
      element.style.top = `${index * ROW_HEIGHT_PX}px`;
      if (row.id === current) element.setAttribute('aria-current', 'true');
      else element.removeAttribute('aria-current');
      const box = element.querySelector<HTMLInputElement>('[data-action="plot"]');
      if (box) box.checked = handlers.plotted(row.id);
    }
    for (const [id, element] of made) {
      if (!wanted.has(id)) {
        element.remove();
        made.delete(id);
      }
    }
  }

  let pending = false;
  viewport.addEventListener('scroll', () => {
    if (pending) return;
    pending = true;
    requestAnimationFrame(() => {
      pending = false;
      draw();
    });
  });
  draw();

  return {
    filter(query) {
      shownRows = rows.filter((row) => matchesSearch(row.searchText, query));
      viewport.scrollTop = 0;
      draw();
      return shownRows.length;
    },
    setCurrent(id, reveal) {
      current = id;
      if (reveal && id !== null) {
        const index = shownRows.findIndex((row) => row.id === id);
        if (index >= 0) {
          const top = index * ROW_HEIGHT_PX;
          if (top < viewport.scrollTop || top + ROW_HEIGHT_PX > viewport.scrollTop + viewport.clientHeight) {
            viewport.scrollTop = top - viewport.clientHeight / 2;
          }
        }
      }
      draw();
    },
    shown: () => shownRows.map((row) => row.id),
    refresh: draw,
  };
}
