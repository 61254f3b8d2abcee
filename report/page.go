package report

import "html/template"

// The parts every page of the report package shares: the document head
// with the common style sheet, the masthead (kicker, title and facts at
// the top of the body), a figure with its caption, lists of facts
// (inside a <dl>), of notes (inside a <ul>) and of section links (inside
// <nav>), and the "not shown" lines of a section. The single-trace page (template.go) and the
// campaign page (campaign_template.go) are parsed together with them.
// Styling goals: plain and readable on screen and on paper — dark text on
// white, thin rules, one accent colour, figures at most one text width
// wide; in print every section starts a new page and no figure or table
// row is split. A page adds its own rules through the view's ExtraCSS.
const pageParts = `{{define "head"}}<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8"/>
<meta name="viewport" content="width=device-width, initial-scale=1"/>
<meta name="generator" content="tracesift"/>
<title>{{.Title}}</title>
<style>
` + pageCSS + `{{.ExtraCSS}}</style>
</head>{{end}}
{{define "figure"}}<figure>
{{.SVG}}
<figcaption>{{.Caption}}</figcaption>
</figure>{{end}}
{{- define "masthead"}}<body>
<header id="summary">
<p class="kicker">{{.Kicker}}</p>
<h1>{{.Source}}</h1>
<dl class="facts">{{template "facts" .Facts}}
</dl>{{end}}
{{- define "facts"}}{{range .}}
<dt>{{.Label}}</dt><dd>{{.Value}}</dd>{{end}}{{end}}
{{- define "notes"}}{{range .}}
<li>{{.}}</li>{{end}}{{end}}
{{- define "nav"}}{{range .}}
<a href="#{{.Label}}">{{.Value}}</a>{{end}}{{end}}
{{- define "failures"}}{{range .}}
<p class="failed">Not shown: {{.}}</p>{{end}}{{end}}`

// pageCSS is the style sheet every page starts with.
const pageCSS = `:root { --ink: #1c232b; --muted: #56606b; --rule: #d3d8de; --accent: #24486b; }
* { box-sizing: border-box; }
html { background: #ffffff; }
body { margin: 0 auto; max-width: 60rem; padding: 1.5rem 1.5rem 3rem; color: var(--ink); background: #ffffff;
  font: 15px/1.55 "DejaVu Serif", Georgia, "Times New Roman", serif; }
h1, h2, h3, nav, table, figcaption, dl, .kicker, .verdict, footer { font-family: "DejaVu Sans", Helvetica, Arial, sans-serif; }
h1 { font-size: 1.45rem; line-height: 1.25; margin: .25rem 0 1rem; overflow-wrap: anywhere; }
h2 { font-size: 1.2rem; margin: 2.4rem 0 .8rem; padding-bottom: .25rem; border-bottom: 2px solid var(--accent); }
h2 .no { color: var(--accent); margin-right: .5rem; }
h3 { font-size: 1rem; margin: 1.4rem 0 .4rem; }
p { margin: .5rem 0; }
.kicker { margin: 0; font-size: .75rem; letter-spacing: .09em; text-transform: uppercase; color: var(--muted); }
dl.facts { display: grid; grid-template-columns: max-content 1fr max-content 1fr; gap: .2rem 1.2rem; margin: .5rem 0 1rem; font-size: .88rem; }
dl.facts dt { color: var(--muted); }
dl.facts dd { margin: 0; overflow-wrap: anywhere; }
dl.two { grid-template-columns: max-content 1fr; }
nav { font-size: .85rem; border-top: 1px solid var(--rule); border-bottom: 1px solid var(--rule); padding: .4rem 0; }
nav a { color: var(--accent); text-decoration: none; margin-right: 1rem; white-space: nowrap; }
figure { margin: 1rem 0 1.2rem; break-inside: avoid; page-break-inside: avoid; }
svg.fig { display: block; max-width: 100%; height: auto; }
svg.bar { display: block; }
figcaption { margin-top: .35rem; font-size: .82rem; line-height: 1.45; color: var(--muted); }
.pair { display: grid; grid-template-columns: repeat(auto-fit, minmax(24rem, 1fr)); gap: 0 1.5rem; align-items: start; }
table { width: 100%; border-collapse: collapse; font-size: .84rem; margin: .4rem 0 1rem; }
th, td { padding: .28rem .5rem; text-align: left; vertical-align: top; border-bottom: 1px solid var(--rule); }
th { font-weight: 600; border-bottom: 1.5px solid var(--ink); }
td.n, th.n { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
td.code, th.code { white-space: nowrap; font-family: "DejaVu Sans Mono", Menlo, Consolas, monospace; font-size: .94em; }
tr.rejected td { font-weight: 600; }
table.compact { font-size: .76rem; }
table.compact td, table.compact th { padding: .18rem .4rem; }
.verdict { margin: 1rem 0; padding: .7rem 1rem; border: 1.5px solid; border-left-width: 9px; }
.verdict .cls { margin: 0; font-size: 1.7rem; font-weight: 700; line-height: 1.2; text-transform: capitalize; }
.verdict p { margin: .25rem 0 0; }
.cls-chaotic { color: #b3412a; border-color: #b3412a; }
.cls-stochastic { color: #2f6f8f; border-color: #2f6f8f; }
.cls-regular { color: #5b8a2e; border-color: #5b8a2e; }
.cls-undetermined { color: #555555; border-color: #6f6f6f; }
.txt-chaotic { color: #b3412a; }
.txt-stochastic { color: #2f6f8f; }
.txt-regular { color: #5b8a2e; }
.verdict p.line { color: var(--ink); font-size: .95rem; }
.agreement { margin: .8rem 0; padding: .4rem .8rem; border-left: 3px solid var(--accent); font-size: .92rem; }
.caution { margin: 1.2rem 0; padding: .6rem 1rem; border: 1px solid var(--ink); font-size: .92rem; }
ul.notes { margin: .3rem 0 .8rem; padding-left: 1.3rem; font-size: .9rem; }
.muted { color: var(--muted); }
.failed { color: #8a2b16; font-size: .9rem; }
ol.refs { font-size: .84rem; padding-left: 1.4rem; }
footer { margin-top: 2.5rem; padding-top: .5rem; border-top: 1px solid var(--rule); font-size: .78rem; color: var(--muted); }
@page { margin: 14mm 13mm; }
@media print {
  html { font-size: 12px; background: #ffffff; }
  body { max-width: none; padding: 0; font-size: 9.5pt; line-height: 1.4; background: #ffffff; }
  nav { display: none; }
  section { break-before: page; page-break-before: always; }
  #verdict { break-before: auto; page-break-before: auto; }
  h2 { margin-top: 0; break-after: avoid; page-break-after: avoid; }
  #verdict h2 { margin-top: 1.2rem; }
  h3 { margin-top: .9rem; break-after: avoid; page-break-after: avoid; }
  figure { margin: .5rem 0 .8rem; }
  figcaption { font-size: 7.5pt; }
  .pair { grid-template-columns: 1fr 1fr; gap: 0 5mm; }
  svg.fig { max-height: 100mm; }
  table { font-size: 8pt; }
  table.compact { font-size: 7.5pt; }
  ol.refs { font-size: 8pt; }
  tr, .verdict, .caution { break-inside: avoid; page-break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
}
`

// parsePage parses a page template with the shared parts. Pages are
// written in XHTML syntax (every element closed, no named entities
// besides the XML ones) so that the output parses as XML as well as HTML.
func parsePage(name, text string) *template.Template {
	return template.Must(template.Must(template.New(name).Parse(text)).Parse(pageParts))
}
