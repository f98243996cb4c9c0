/**
 * The listening page's look: warm paper, dark ink, one teal accent, a dark
 * player bar docked at the bottom. Plain CSS, inlined by the page and pinned
 * by hash in its Content-Security-Policy.
 */
export const PAGE_STYLE = `
:root {
  --paper: #f4efe6; --card: #fffdf8; --ink: #1d1b16; --muted: #645c50; --line: #ddd3c2;
  --accent: #0f766e; --accent-soft: #d5ece8; --quiet: #15803d; --partly: #a16207; --noisy: #b4480b;
  --bar: #24211b; --bar-ink: #f4efe6; --focus: #2563eb;
  font-family: system-ui, -apple-system, "Segoe UI", Roboto, "Noto Sans", sans-serif;
  color: var(--ink); background: var(--paper); line-height: 1.45;
}
* { box-sizing: border-box; }
body { margin: 0; padding: 0 0 8.5rem; }
main, .masthead, .footer { max-width: 86rem; margin: 0 auto; padding: 0 1.25rem; }
h1, h2, h3 { line-height: 1.2; }
h2 { font-size: 1.3rem; margin: 2.2rem 0 0.6rem; }
a { color: var(--accent); }
code { font-family: ui-monospace, "SFMono-Regular", Menlo, Consolas, monospace; font-size: 0.9em; }
:focus-visible { outline: 3px solid var(--focus); outline-offset: 2px; }
.visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip-path: inset(50%); white-space: nowrap; }
.skip { position: absolute; left: -999px; top: 0; background: var(--card); padding: 0.5rem; }
.skip:focus { left: 0.5rem; }
button, select, input { font: inherit; color: inherit; }
button { cursor: pointer; border: 1px solid var(--line); background: var(--card); border-radius: 0.4rem; padding: 0.3rem 0.7rem; }
button:hover { border-color: var(--accent); }
button:disabled { cursor: not-allowed; opacity: 0.45; }
select, input[type="number"] { border: 1px solid var(--line); border-radius: 0.35rem; background: var(--card); padding: 0.2rem 0.35rem; }

.masthead { padding-top: 1.6rem; }
.kicker { margin: 0; font-size: 0.8rem; letter-spacing: 0.12em; text-transform: uppercase; color: var(--accent); font-weight: 600; }
.masthead h1 { margin: 0.2rem 0 0.4rem; font-size: 2rem; overflow-wrap: anywhere; }
.lede { margin: 0; font-size: 1.08rem; max-width: 52rem; }
.warn-volume { display: inline-block; margin: 0.7rem 0 0; padding: 0.25rem 0.6rem; border-left: 4px solid var(--noisy); background: #fbe9dc; font-weight: 600; }
.noscript { background: #fbe9dc; padding: 0.6rem 1.25rem; }

.start { background: var(--card); border: 1px solid var(--line); border-radius: 0.7rem; padding: 0.2rem 1.2rem 0.6rem; margin-top: 1.4rem; }
.start h2 { margin-top: 0.9rem; }
.start ol { margin: 0.3rem 0 0.4rem; padding-left: 1.3rem; }
.start li { margin: 0.35rem 0; }
.start button { background: var(--accent); color: #fff; border-color: var(--accent); }

.filters { display: flex; flex-wrap: wrap; gap: 0.6rem 1.1rem; align-items: flex-end; padding: 0.7rem 0.9rem; background: var(--card); border: 1px solid var(--line); border-radius: 0.6rem; }
.filters label { display: flex; flex-direction: column; gap: 0.15rem; font-size: 0.88rem; color: var(--muted); }
.filters label.check { flex-direction: row; align-items: center; gap: 0.35rem; color: var(--ink); font-size: 1rem; }
.filters fieldset { display: flex; gap: 0.6rem; border: 0; padding: 0; margin: 0; }
.filters legend { font-size: 0.88rem; color: var(--muted); padding: 0; margin-bottom: 0.15rem; float: left; width: 100%; }
.coil-filter span { font-weight: 600; color: var(--ink); }
#shown-count { margin-left: auto; color: var(--muted); font-size: 0.9rem; }

.help { margin: 0.7rem 0; }
.help summary { cursor: pointer; color: var(--accent); font-weight: 600; }
.help dl { display: grid; grid-template-columns: 9rem 1fr; gap: 0.3rem 1rem; margin: 0.5rem 0 0; }
.help dt { font-weight: 600; }
.help dd { margin: 0; }
.bands { display: flex; flex-wrap: wrap; gap: 0.2rem 1.2rem; padding: 0; list-style: none; margin: 0.3rem 0 0; }

.scroll { overflow-x: auto; }
.table-wrap { background: var(--card); border: 1px solid var(--line); border-radius: 0.6rem; }
table.wirings { border-collapse: collapse; width: 100%; font-size: 0.93rem; }
.wirings th, .wirings td { padding: 0.45rem 0.55rem; text-align: left; vertical-align: top; border-bottom: 1px solid var(--line); }
.wirings thead th { position: sticky; top: 0; background: #ece4d6; z-index: 1; font-size: 0.85rem; white-space: nowrap; }
.wirings thead button { border: 0; background: none; padding: 0; font-weight: 700; }
.wirings thead button:hover { color: var(--accent); }
.wirings th[aria-sort="ascending"] .sort-mark::after { content: " \\25B2"; color: var(--accent); }
.wirings th[aria-sort="descending"] .sort-mark::after { content: " \\25BC"; color: var(--accent); }
.wirings tbody tr:nth-child(even) { background: #faf6ee; }
.wirings tbody tr:hover { background: var(--accent-soft); }
.wirings tbody tr[aria-current="true"] { background: var(--accent-soft); box-shadow: inset 4px 0 0 var(--accent); }
.wirings td.number { color: var(--muted); font-variant-numeric: tabular-nums; }
.wirings td.wiring { min-width: 14rem; }
.wirings .description { display: block; font-weight: 600; }
.wirings .expression { display: block; color: var(--muted); font-size: 0.85rem; margin-top: 0.1rem; }
.wirings .expression code { color: var(--ink); background: #efe8dc; padding: 0 0.25rem; border-radius: 0.2rem; }
.wirings .id { margin-left: 0.3rem; }
.wav-link { margin-left: 0.3rem; font-size: 0.8rem; }
.wirings td.level, .wirings .figure { font-variant-numeric: tabular-nums; white-space: nowrap; }
.wirings td.bright, .wirings td.peak, .wirings td.hum, .wirings td.topology, .wirings td.phase { white-space: nowrap; }
.wirings .word { display: block; }
.wirings .figure { display: block; color: var(--muted); font-size: 0.85rem; }
.bar { display: block; margin: 0.2rem 0; }
.bar-back { fill: #e7dfd1; }
.bar-fill { fill: #d49a1a; }
.hum-mark { display: inline-flex; align-items: center; gap: 0.35rem; font-weight: 600; }
.hum-mark .dot { width: 0.7rem; height: 0.7rem; border-radius: 50%; display: inline-block; }
.hum-quiet { color: var(--quiet); } .hum-quiet .dot { background: var(--quiet); }
.hum-partly { color: var(--partly); } .hum-partly .dot { background: var(--partly); border-radius: 0.15rem; }
.hum-noisy { color: var(--noisy); } .hum-noisy .dot { background: transparent; border: 2px solid var(--noisy); }

.play { width: 2.3rem; height: 2.3rem; border-radius: 50%; padding: 0; display: inline-flex; align-items: center; justify-content: center; background: var(--card); border: 2px solid var(--accent); }
.play:hover:not(:disabled) { background: var(--accent-soft); }
.play-icon { display: inline-block; width: 0; height: 0; border-style: solid; border-width: 0.45rem 0 0.45rem 0.75rem; border-color: transparent transparent transparent var(--accent); margin-left: 0.2rem; }
.is-playing .play-icon { width: 0.7rem; height: 0.85rem; border-width: 0 0.22rem; border-color: var(--accent); margin-left: 0; }
.wirings tbody tr[aria-current="true"] .play { background: var(--accent); }
.wirings tbody tr[aria-current="true"] .play-icon { border-left-color: #fff; }
.wirings tbody tr[aria-current="true"] .is-playing .play-icon { border-color: #fff; }
td.compare input { width: 1.1rem; height: 1.1rem; margin-top: 0.6rem; }

.plot-wrap { background: var(--card); border: 1px solid var(--line); border-radius: 0.6rem; padding: 0.4rem; }
#response-plot { width: 100%; height: auto; display: block; }
#response-plot .grid line { stroke: #e4dccd; stroke-width: 1; }
#response-plot .grid line.zero { stroke: #b9ad98; }
#response-plot text { font-size: 11px; fill: var(--muted); }
#response-plot text.axis { font-size: 12px; fill: var(--ink); }
#response-plot .cursor { stroke: var(--ink); stroke-width: 1; stroke-dasharray: 3 3; }
#response-plot .peak-marker { stroke: #fff; stroke-width: 2; }
#response-plot .peak-marker:focus { outline: none; stroke: var(--focus); stroke-width: 3; }
.readout { font-variant-numeric: tabular-nums; min-height: 1.5rem; }
.legend { list-style: none; padding: 0; margin: 0.3rem 0 0.8rem; display: grid; gap: 0.2rem; }
.legend li { display: flex; align-items: center; gap: 0.5rem; }

.blind-pick { display: flex; flex-wrap: wrap; gap: 0.6rem 1rem; align-items: center; }
.blind-pick select { max-width: 26rem; }
.blind-rounds { margin-top: 0.8rem; padding: 0.8rem 1rem; background: var(--card); border: 1px solid var(--line); border-radius: 0.6rem; }
.blind-hear, .blind-name { display: flex; flex-wrap: wrap; gap: 0.5rem; margin: 0.5rem 0; }
.blind-name button { background: var(--accent); color: #fff; border-color: var(--accent); font-weight: 600; }
.score { font-weight: 600; }
.blind-answers li.right { color: var(--quiet); } .blind-answers li.wrong { color: var(--noisy); }

table.facts { border-collapse: collapse; font-size: 0.92rem; background: var(--card); }
.facts caption { text-align: left; color: var(--muted); padding-bottom: 0.3rem; }
.facts th, .facts td { border: 1px solid var(--line); padding: 0.3rem 0.55rem; text-align: left; }
#glossary dl { display: grid; grid-template-columns: 10rem 1fr; gap: 0.35rem 1rem; }
#glossary dt { font-weight: 700; }
#glossary dd { margin: 0; }
#cautions { border-left: 5px solid var(--noisy); padding-left: 1rem; }
.footer { color: var(--muted); font-size: 0.9rem; padding-top: 1.5rem; }

.transport { position: fixed; left: 0; right: 0; bottom: 0; z-index: 5; display: flex; flex-wrap: wrap; align-items: center; gap: 0.45rem 1rem; padding: 0.6rem 1.25rem; background: var(--bar); color: var(--bar-ink); box-shadow: 0 -4px 18px rgba(0,0,0,0.18); }
.transport button { background: #37322a; border-color: #57503f; color: var(--bar-ink); }
.transport input[type="number"] { width: 4.2rem; background: #37322a; border-color: #57503f; color: var(--bar-ink); }
.big-play { width: 3rem; height: 3rem; border-radius: 50%; padding: 0; display: inline-flex; align-items: center; justify-content: center; background: var(--accent) !important; border: 0 !important; }
.big-play .play-icon { border-left-color: #fff; }
.big-play.is-playing .play-icon { border-color: #fff; }
.now { display: flex; flex-direction: column; min-width: 14rem; flex: 1 1 18rem; }
#now-label { font-weight: 700; overflow-wrap: anywhere; }
#now-detail { font-size: 0.85rem; color: #d8cdb9; min-height: 1.1rem; }
.scrub input { width: 14rem; accent-color: #2dd4bf; }
#time { font-variant-numeric: tabular-nums; min-width: 8.5rem; }
.transport fieldset { border: 0; padding: 0; margin: 0; display: flex; gap: 0.45rem; align-items: center; flex-wrap: wrap; }
.transport .check { display: inline-flex; gap: 0.3rem; align-items: center; }
.level-switch { font-weight: 600; }
.volume input { width: 7rem; accent-color: #2dd4bf; vertical-align: middle; }
.level-note { flex-basis: 100%; font-size: 0.85rem; color: #d8cdb9; }

@media (max-width: 48rem) {
  body { padding-bottom: 14rem; }
  .help dl, #glossary dl { grid-template-columns: 1fr; }
  .scrub input { width: 9rem; }
}
`;
