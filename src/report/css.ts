/** The page style of the HTML report: calm screen layout, and a print layout for A4 / letter. */
export const plotCss = `
:root { --ink: #1f2933; --muted: #52606d; --rule: #d9e2ec; --accent: #334e68; }
* { box-sizing: border-box; }
body { margin: 0 auto; max-width: 1040px; padding: 24px 28px 40px; color: var(--ink);
  font: 14px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; background: #fff; }
header { border-bottom: 3px solid var(--accent); margin-bottom: 12px; }
.tool { margin: 0; color: var(--muted); font-size: 12px; letter-spacing: .04em; text-transform: uppercase; }
h1 { margin: 4px 0 6px; font-size: 24px; overflow-wrap: anywhere; }
h2 { font-size: 18px; margin: 28px 0 8px; padding-bottom: 3px; border-bottom: 1px solid var(--rule); }
h3 { font-size: 16px; margin: 0 0 6px; overflow-wrap: anywhere; }
.lede { margin: 0 0 8px; }
.detection { margin: 0 0 8px; color: var(--muted); font-size: 13px; }
.above-yield { color: #9b2c2c; font-weight: 600; }
.warnings { border-left: 4px solid #9b2c2c; background: #fff5f5; padding: 6px 10px 6px 28px; margin: 8px 0 12px; }
.caution { border-left: 4px solid #b7791f; background: #fffaf0; padding: 6px 10px; margin: 8px 0 12px; }
table { border-collapse: collapse; }
table.facts th { text-align: left; font-weight: 600; padding: 3px 14px 3px 0; vertical-align: top; max-width: 24em; color: var(--muted); }
table.facts td { padding: 3px 0; overflow-wrap: break-word; }
table.facts ul { margin: 0; padding-left: 18px; }
table.verdicts, table.levels { width: 100%; font-variant-numeric: tabular-nums; }
table.verdicts th, table.verdicts td, table.levels th, table.levels td { text-align: left; padding: 4px 8px; border-bottom: 1px solid var(--rule); overflow-wrap: break-word; }
table.verdicts td:nth-child(4) { white-space: nowrap; }
table.envelope td.governs { background: color-mix(in srgb, var(--accent) 12%, transparent); }
details.case { margin: 0.5em 0; }
table.verdicts thead th, table.levels thead th { border-bottom: 2px solid var(--accent); }
.verdict { display: inline-block; white-space: nowrap; padding: 0 8px; border-radius: 10px; font-size: 12px; font-weight: 700; border: 1.5px solid; }
.verdict-converging { color: #2b6a3a; border-color: #2b8a3e; background: #ebfbee; }
.verdict-singular { color: #8a1c5c; border-color: #a61e4d; background: #fff0f6; }
.verdict-undecided { color: #7c5a00; border-color: #d39e00; background: #fff9db; }
.where { font-weight: 400; color: var(--muted); font-size: 13px; }
section.site { border: 1px solid var(--rule); border-radius: 6px; padding: 12px 14px; margin: 14px 0; }
.site-figures { display: flex; flex-wrap: wrap; gap: 8px; align-items: flex-start; }
figure { margin: 0; }
svg { max-width: 100%; height: auto; }
.legend-text, .small { color: var(--muted); font-size: 12.5px; }
.toggle-input { position: absolute; opacity: 0; width: 1px; height: 1px; }
.toggle { display: inline-block; cursor: pointer; user-select: none; border: 1px solid var(--accent); border-radius: 14px; padding: 1px 12px; font-size: 12.5px; color: var(--accent); }
.toggle::before { content: "○ "; }
#show-mesh:checked ~ main .toggle::before { content: "● "; }
#show-mesh:focus-visible ~ main .toggle { outline: 2px solid var(--accent); }
.mesh-overlay { display: none; }
#show-mesh:checked ~ main .mesh-overlay { display: inline; }
ul.checks { list-style: none; padding: 0; display: flex; flex-wrap: wrap; gap: 6px; }
ul.checks li { border: 1px solid var(--rule); border-radius: 12px; padding: 1px 10px; font-size: 12.5px; }
ul.checks li.pass .mark { color: #2b8a3e; margin-right: 5px; font-weight: 700; }
ul.checks li.fail { border-color: #e03131; }
ul.checks li.fail .mark { color: #e03131; margin-right: 5px; font-weight: 700; }
details summary { cursor: pointer; color: var(--muted); margin-top: 6px; }
code { font-size: 12.5px; overflow-wrap: anywhere; }
footer { margin-top: 28px; border-top: 1px solid var(--rule); }
@page { size: auto; margin: 14mm 12mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 10.5pt; }
  .toggle-row { display: none; }
  h2 { break-after: avoid; }
  section.site, figure, table.facts, table.verdicts tr { break-inside: avoid; }
  section.site { border: none; padding: 0; border-top: 1px solid var(--rule); border-radius: 0; }
  details > summary { list-style: none; }
  a { color: inherit; text-decoration: none; }
  svg { max-width: 100%; }
}
`;
