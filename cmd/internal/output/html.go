package output

import (
	"html/template"
	"io"
)

// Report is an HTML report: one self-contained page of designs, their
// comparison, figures as inline SVG, warnings, sources and the caution.
type Report struct {
	Title    string
	Caution  string
	Units    string // "metric" or "US"
	Headline *Grid  // each design's answer in a row: opens the page, before any detail
	Compare  []Grid
	Explain  []string
	Figures  []Figure
	Designs  []ReportDesign
	Warnings []string
	Alerts   []string // limits passed: over a temperature limit, past the rated power
	Sources  []string
	Made     string // the tool's version, the date and the command line that wrote the report
}

// Figure is an inline SVG figure with its caption; SVG must come from a
// renderer that escapes its text (the caller checks it holds no script).
type Figure struct {
	SVG     template.HTML
	Caption string
}

// ReportDesign is one design's section: its inputs and result tables.
type ReportDesign struct {
	Name, Source string
	Inputs       []Grid
	Results      []Grid
	Notes        []string
	Defaults     []string
}

// WriteHTML renders the report with html/template, which escapes every
// text (a design name holding markup shows as text).
func WriteHTML(w io.Writer, r Report) error { return reportTmpl.Execute(w, r) }

const reportHTML = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>finmarch report: {{.Title}}</title>
<style>
body { font-family: system-ui, sans-serif; margin: 2rem auto; max-width: 70rem; padding: 0 1rem; color: #1b1b1b; line-height: 1.45; }
h1 { font-size: 1.35rem; margin-bottom: .3rem; }
#headline td.n { white-space: nowrap; }
#headline h2 { margin-top: 1.2rem; }
h2 { font-size: 1.25rem; border-bottom: 2px solid #1f4e9c; padding-bottom: .2rem; margin-top: 2.2rem; }
h3 { font-size: 1.05rem; margin-top: 1.4rem; }
.caution { background: #fff4e5; border-left: 5px solid #c2410c; padding: .7rem 1rem; font-weight: 600; }
table { border-collapse: collapse; margin: .6rem 0 1rem; font-size: .9rem; }
th, td { border: 1px solid #c8c8c8; padding: .25rem .55rem; }
th { background: #eef2f8; text-align: center; }
td.n { text-align: right; font-variant-numeric: tabular-nums; }
td.l { text-align: left; white-space: pre-wrap; }
figure { margin: 1rem 0 2rem; }
figcaption { font-size: .9rem; color: #444; }
.warn li { color: #8a2c00; }
.note { font-size: .92rem; }
footer { margin-top: 3rem; font-size: .85rem; color: #555; }
@media print {
  body { font-size: 10pt; max-width: none; margin: 0; color: #000; }
  h2 { page-break-after: avoid; }
  table, figure, .caution { page-break-inside: avoid; }
  section.design, #warnings, #sources { page-break-before: always; }
  svg { max-width: 100%; height: auto; }
  .caution { border: 1.5pt solid #000; }
}
</style>
</head>
<body>
<header>
<h1>{{.Title}}</h1>
<p class="caution" id="caution">{{.Caution}}</p>
</header>
{{with .Headline}}<section id="headline">
<h2>At a glance</h2>
{{template "table" .}}
<p class="note">Wall temperatures at the fin roots, each by its design's own air-side method; the band is the 5th to 95th percentile, the chance over the head's limit is the band's; the status is the nominal estimate's. The detail follows below.</p>
</section>{{end}}
<p class="note" id="made">{{.Made}}</p>
<p class="note">Units: {{.Units}}. Wall temperatures are the metal at the fin roots; the combustion-side surface and the spark-plug seat run hotter.</p>
{{define "table"}}{{if .Title}}<h3>{{.Title}}</h3>{{end}}
<table>
<thead><tr>{{range .Header}}<th>{{.}}</th>{{end}}</tr></thead>
<tbody>{{$left := .Left}}{{range .Rows}}<tr>{{range $i, $c := .}}<td class="{{if lt $i $left}}l{{else}}n{{end}}">{{$c}}</td>{{end}}</tr>
{{end}}</tbody>
</table>{{end}}
{{if .Compare}}<section id="comparison">
<h2>Comparison</h2>
{{range .Compare}}{{template "table" .}}{{end}}
{{range .Explain}}<p class="note">{{.}}</p>{{end}}
</section>{{end}}
<section id="figures">
<h2>Figures</h2>
{{range .Figures}}<figure>{{.SVG}}<figcaption>{{.Caption}}</figcaption></figure>
{{end}}</section>
{{range .Designs}}<section class="design">
<h2>{{.Name}}</h2>
<p class="note">Design file: {{.Source}}</p>
{{range .Inputs}}{{template "table" .}}{{end}}
{{range .Results}}{{template "table" .}}{{end}}
{{range .Notes}}<p class="note">{{.}}</p>{{end}}
{{if .Defaults}}<h3>Defaults applied</h3><ul class="note">{{range .Defaults}}<li>{{.}}</li>{{end}}</ul>{{end}}
</section>
{{end}}<section id="warnings">
<h2>Warnings</h2>
{{if .Alerts}}<ul class="warn">{{range .Alerts}}<li><strong>Over a limit:</strong> {{.}}</li>{{end}}</ul>{{end}}
{{if .Warnings}}<ul class="warn">{{range .Warnings}}<li>{{.}}</li>{{end}}</ul>{{else}}<p>No correlation was used outside its stated range.</p>{{end}}
</section>
<section id="sources">
<h2>Model and sources</h2>
<ul class="note">{{range .Sources}}<li>{{.}}</li>{{end}}</ul>
</section>
<footer><p>{{.Caution}}</p><p>Written by finmarch.</p></footer>
</body>
</html>
`

var reportTmpl = template.Must(template.New("report").Parse(reportHTML))
