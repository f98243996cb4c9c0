/** The knobs' bar, on both pages (added to page-style.ts's rules). */
export const KNOBS_STYLE = `
.knobs { display: flex; flex-wrap: wrap; gap: 0.6rem 1.4rem; align-items: center; background: var(--card); border: 1px solid var(--line); border-radius: 0.6rem; padding: 0.6rem 0.9rem; margin: 0.6rem 0; }
`;

/** The look of the listening page's knobs, finder and virtualised list (added to page-style.ts's rules). */
export const PAGE_LIST_STYLE = `${KNOBS_STYLE}
.finder { display: flex; flex-wrap: wrap; gap: 0.6rem 1.4rem; align-items: center; background: var(--card); border: 1px solid var(--line); border-radius: 0.6rem; padding: 0.6rem 0.9rem; margin: 0.6rem 0; }
.finder .expression { display: flex; flex-wrap: wrap; gap: 0.5rem; align-items: center; }
.finder input[type="search"], .finder input[type="text"] { min-width: 16rem; border: 1px solid var(--line); border-radius: 0.35rem; padding: 0.25rem 0.4rem; background: var(--paper); }
.list-head, .wiring-row { display: grid; grid-template-columns: 2.2rem 3rem minmax(9rem, 1.3fr) minmax(10rem, 2fr) 5rem 9rem 12rem 9rem 4rem; gap: 0.5rem; align-items: center; padding: 0 0.5rem; }
.list-head { font-size: 0.85rem; font-weight: 700; background: #ece4d6; border-radius: 0.6rem 0.6rem 0 0; height: 2rem; margin-top: 0.6rem; }
.wiring-list { position: relative; height: 30rem; overflow-y: auto; background: var(--card); border: 1px solid var(--line); border-radius: 0 0 0.6rem 0.6rem; }
.list-spacer { position: relative; }
.wiring-row { position: absolute; left: 0; right: 0; height: 34px; font-size: 0.9rem; border-bottom: 1px solid var(--line); white-space: nowrap; }
.wiring-row .cell { overflow: hidden; text-overflow: ellipsis; }
.wiring-row[aria-current="true"] { background: var(--accent-soft); }
.row-play { width: 1.9rem; height: 1.7rem; padding: 0; }
.row-play::before { content: "\\25B6"; }
.blind-pick, .blind-hear, .blind-name { display: flex; flex-wrap: wrap; gap: 0.5rem; margin: 0.5rem 0; }
`;
