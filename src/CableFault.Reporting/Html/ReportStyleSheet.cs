namespace CableFault.Reporting.Html;

/// <summary>
/// The report's own look: warm white paper, ink-blue headings, copper for findings that need attention, muted green
/// for what is as expected (the plot palette's colours, <see cref="Plots.FigurePalette"/>). Nothing depends on colour
/// alone: every state also has a word and a border weight, so a black-and-white print reads the same.
/// </summary>
public static class ReportStyleSheet
{
    /// <summary>The CSS, embedded in the document's head.</summary>
    public const string Css = """
:root {
  --paper: #fffdf8; --ink: #1f2430; --blue: #1d3557; --copper: #b5562a; --green: #2f6b4f;
  --rule: #e4e0d8; --shade: #f5f0e4; --muted: #6b6459;
  --serif: Charter, "Bitstream Charter", "Source Serif 4", "DejaVu Serif", Georgia, serif;
  --sans: "Source Sans 3", "Fira Sans", "DejaVu Sans", "Segoe UI", system-ui, sans-serif;
}
* { box-sizing: border-box; }
html { background: var(--paper); color: var(--ink); }
body { margin: 0 auto; max-width: 60rem; padding: 1.5rem 1.25rem 3rem; font: 16px/1.5 var(--serif); }
h1, h2, h3, .label, th, .tag, footer { font-family: var(--sans); }
h1 { font-size: 1.9rem; line-height: 1.2; margin: .2rem 0 .8rem; color: var(--blue); overflow-wrap: anywhere; }
h2 { font-size: 1.15rem; color: var(--blue); margin: 2rem 0 .6rem; padding-bottom: .2rem; border-bottom: 2px solid var(--blue);
     letter-spacing: .02em; break-after: avoid; }
h2 .num { color: var(--copper); margin-right: .5rem; }
p { margin: .4rem 0; }
.masthead { border-top: 6px solid var(--blue); padding-top: .6rem; }
.kicker { font-family: var(--sans); text-transform: uppercase; letter-spacing: .14em; font-size: .75rem; color: var(--muted); margin: 0; }
.job { display: grid; grid-template-columns: repeat(auto-fit, minmax(13rem, 1fr)); gap: .1rem 1.5rem; margin: 0; }
.job div { border-bottom: 1px solid var(--rule); padding: .3rem 0; }
.job dt { font-family: var(--sans); font-size: .78rem; letter-spacing: .02em; color: var(--muted); }
.job dd { margin: 0; overflow-wrap: anywhere; }
.missing { color: var(--muted); font-style: italic; }
.summary { margin: 1.4rem 0 .5rem; padding: .8rem 1rem; background: var(--shade); border-left: 8px solid var(--copper); break-inside: avoid; }
.summary.calm { border-left-color: var(--green); }
.summary .headline { font: 600 1.3rem/1.35 var(--sans); margin: 0; }
.summary ul { margin: .5rem 0 0; padding-left: 1.3rem; }
.summary .ref { font: 400 .8rem var(--sans); color: var(--muted); white-space: nowrap; }
.figure { margin: 1rem 0; overflow-x: auto; break-inside: avoid; }
.figure img { display: block; width: 100%; min-width: 36rem; height: auto; border: 1px solid var(--rule); }
.figure figcaption, .note { font-size: .88rem; color: var(--muted); }
.tablewrap { overflow-x: auto; }
table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; }
th { text-align: left; font-size: .82rem; font-weight: 600; color: var(--muted);
     border-bottom: 2px solid var(--ink); padding: .35rem .5rem; vertical-align: bottom; }
td { border-bottom: 1px solid var(--rule); padding: .4rem .5rem; vertical-align: top; }
td.n { text-align: right; white-space: nowrap; }
tr { break-inside: avoid; }
tr.attention td:first-child { border-left: 4px solid var(--copper); }
tr.expected td:first-child { border-left: 4px dotted var(--green); }
tr.echo td { color: var(--muted); }
td .kind { display: block; font-weight: 600; }
td .usually { display: block; font-size: .82rem; color: var(--muted); line-height: 1.3; }
.tag { display: inline-block; font-size: .76rem; letter-spacing: .02em; padding: 0 .35rem;
       border: 1px solid currentColor; border-radius: 2px; }
.tag.attention { color: var(--copper); font-weight: 700; }
.tag.expected { color: var(--green); }
.tag.possible { color: var(--muted); }
.settings { display: grid; grid-template-columns: max-content 1fr; gap: .25rem 1.2rem; margin: 0; }
.settings dt { font-family: var(--sans); font-weight: 600; }
.settings dd { margin: 0; }
.verdict { font: 700 1.1rem var(--sans); }
.verdict.pass { color: var(--green); } .verdict.fail { color: var(--copper); }
.formula { font-family: var(--serif); font-style: italic; white-space: nowrap; }
.safety { border: 2px solid var(--ink); padding: .6rem 1rem; break-inside: avoid; }
.safety ul { margin: .3rem 0; padding-left: 1.2rem; }
footer { margin-top: 2.5rem; padding-top: .5rem; border-top: 1px solid var(--rule); font-size: .78rem; color: var(--muted); }
@media (max-width: 40rem) {
  body { padding: 1rem .75rem 2rem; font-size: 15px; }
  h1 { font-size: 1.5rem; }
  .summary .headline { font-size: 1.1rem; }
  .job { grid-template-columns: repeat(auto-fit, minmax(9rem, 1fr)); gap: 0 1rem; }
  .settings { grid-template-columns: 1fr; }
  table.events thead { display: none; }
  table.events tr { display: grid; grid-template-columns: 1fr 1fr; gap: .1rem 1rem; padding: .5rem 0 .5rem .6rem;
                    border-bottom: 1px solid var(--rule); }
  table.events tr.attention { border-left: 4px solid var(--copper); }
  table.events tr.expected { border-left: 4px dotted var(--green); }
  table.events td { display: block; border: none; padding: 0; text-align: left; }
  table.events td:first-child { border: none; }
  table.events td.what { grid-column: 1 / -1; }
  table.events td.as-built { grid-column: 1 / -1; }
  table.events td[data-label]::before { content: attr(data-label); display: block; font: .72rem var(--sans); color: var(--muted); }
  .settings dd { margin-bottom: .4rem; }
}
@page { size: auto; margin: 14mm 13mm 16mm; }
@page { @bottom-right { content: "page " counter(page) " of " counter(pages); font: 8pt sans-serif; color: #555; } }
@media print {
  html, body { background: #fff; }
  body { max-width: none; padding: 0; font-size: 10.5pt; }
  h1 { font-size: 18pt; }
  h2 { font-size: 12.5pt; margin-top: 1.2rem; }
  .summary { background: none; border: 1px solid var(--ink); border-left-width: 8px; }
  .figure { overflow: visible; }
  .figure img { min-width: 0; border: none; }
  .tablewrap { overflow: visible; }
  thead { display: table-header-group; }
  a { color: inherit; text-decoration: none; }
}
""";
}
