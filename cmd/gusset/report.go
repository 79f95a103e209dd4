package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"html"
	"math"
	"os"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"gusset/cmd/gusset/adapter"
	"gusset/engine/render"
	"gusset/protocol"
)

// reportRowLimit is the most rows a table shows in the report; the CSV
// files (--csv) hold them all.
const reportRowLimit = 200

// reportCSS is the report's own style: print-friendly (no backgrounds
// needed, tables and pictures kept whole across pages), in the pictures'
// font. Class names start with "g-" so that the pictures' own style
// sheets, which apply to the whole page once inlined, cannot touch them.
const reportCSS = `
body { font-family: ` + render.FontFamily + `; color: ` + render.InkColour + `; margin: 2em auto; max-width: 1150px; padding: 0 1em; line-height: 1.4; }
h1 { font-size: 1.6em; margin-bottom: 0.2em; }
h2 { font-size: 1.25em; border-bottom: 2px solid ` + render.TensionColour + `; padding-bottom: 0.2em; margin-top: 2em; }
h3 { font-size: 1.05em; margin-bottom: 0.3em; }
.g-caution { border-left: 5px solid ` + render.CompressionColour + `; padding: 0.5em 1em; background: #fbf4ea; }
.g-error { border-left: 5px solid ` + render.CompressionColour + `; padding: 0.3em 1em; }
.g-meta { color: #555; font-size: 0.9em; }
table.g-table { border-collapse: collapse; font-size: 0.85em; margin: 0.5em 0 1em; }
table.g-table th, table.g-table td { border: 1px solid #ccc; padding: 2px 8px; }
table.g-table th { background: #f0f0f0; text-align: left; }
table.g-table td.g-num { text-align: right; font-variant-numeric: tabular-nums; }
table.g-table td.g-empty { color: #888; }
dl.g-inputs { display: grid; grid-template-columns: max-content auto; gap: 2px 1em; }
dl.g-inputs dt { font-weight: bold; }
dl.g-inputs dd { margin: 0; }
.g-picture svg { max-width: 100%; height: auto; border: 1px solid #eee; }
nav.g-contents ol { columns: 2; }
@media print {
  body { margin: 0; max-width: none; font-size: 10pt; }
  nav.g-contents { display: none; }
  h2 { break-before: page; }
  h2:first-of-type { break-before: auto; }
  table.g-table, .g-picture, figure { break-inside: avoid; }
  .g-caution { background: none; }
  a { color: inherit; text-decoration: none; }
}
`

// writeReport writes one self-contained HTML page laying out every answer
// as an engineer reads it: inputs, warnings, pictures, sweep charts and
// tables, with the caution at the top and bottom. It has no scripts and
// no external links; the pictures are inline SVG.
func writeReport(file, title string, list []answered) error {
	var b bytes.Buffer
	fmt.Fprintf(&b, "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>%s</title>\n<style>%s</style>\n</head>\n<body>\n",
		html.EscapeString(title), reportCSS)
	fmt.Fprintf(&b, "<h1>%s</h1>\n<p class=\"g-meta\">Written by gusset %s (protocol %s). Lengths, forces and their units are those each request's model declares; tension positive.</p>\n",
		html.EscapeString(title), version, protocol.Version)
	fmt.Fprintf(&b, "<p class=\"g-caution\"><strong>Caution.</strong> %s</p>\n", html.EscapeString(adapter.Caution))
	b.WriteString("<nav class=\"g-contents\"><h3>Contents</h3><ol>\n")
	for i, a := range list {
		fmt.Fprintf(&b, "<li><a href=\"#r%d\">%s</a></li>\n", i, html.EscapeString(sectionTitle(a)))
	}
	b.WriteString("</ol></nav>\n")
	for i, a := range list {
		reportSection(&b, i, a)
	}
	fmt.Fprintf(&b, "<p class=\"g-caution\">%s</p>\n</body>\n</html>\n", html.EscapeString(adapter.Caution))
	return os.WriteFile(file, b.Bytes(), 0o644)
}

func sectionTitle(a answered) string {
	id := strings.Trim(string(a.ID), `"`)
	return id + ": " + a.Method
}

func reportSection(b *bytes.Buffer, i int, a answered) {
	fmt.Fprintf(b, "<section>\n<h2 id=\"r%d\">%s</h2>\n", i, html.EscapeString(sectionTitle(a)))
	reportInputs(b, a)
	if e := a.Response.Error; e != nil {
		fmt.Fprintf(b, "<div class=\"g-error\"><p><strong>Error %d:</strong> %s</p>", e.Code, html.EscapeString(e.Message))
		var data struct {
			Problems []protocol.Problem `json:"problems"`
		}
		if raw, err := json.Marshal(e.Data); err == nil {
			_ = json.Unmarshal(raw, &data)
		}
		if len(data.Problems) > 0 {
			b.WriteString("<ul>")
			for _, p := range data.Problems {
				fmt.Fprintf(b, "<li><code>%s</code>: %s</li>", html.EscapeString(p.Path), html.EscapeString(p.Message))
			}
			b.WriteString("</ul>")
		}
		b.WriteString("</div>\n</section>\n")
		return
	}
	reportWarnings(b, a.Response.Result)
	if p := pictureOf(a.Response); p != "" {
		fmt.Fprintf(b, "<div class=\"g-picture\">%s</div>\n", inlineSVG(p, fmt.Sprintf("p%d-", i)))
	}
	if sw, ok := a.Response.Result.(*protocol.SweepResult); ok {
		for k, chart := range sweepCharts(sw) {
			fmt.Fprintf(b, "<div class=\"g-picture\">%s</div>\n", inlineSVG(chart, fmt.Sprintf("c%d-%d-", i, k)))
		}
	}
	for _, t := range resultTables(a) {
		reportTable(b, t)
	}
	b.WriteString("</section>\n")
}

// reportInputs summarises a request's params: the model's size and units,
// and the method's own settings.
func reportInputs(b *bytes.Buffer, a answered) {
	var p map[string]json.RawMessage
	_ = json.Unmarshal(a.Params, &p)
	b.WriteString("<h3>Inputs</h3>\n<dl class=\"g-inputs\">\n")
	item := func(k, v string) {
		fmt.Fprintf(b, "<dt>%s</dt><dd>%s</dd>\n", html.EscapeString(k), html.EscapeString(v))
	}
	if raw, ok := p["model"]; ok {
		var m map[string]json.RawMessage
		_ = json.Unmarshal(raw, &m)
		var dim int
		_ = json.Unmarshal(m["dimension"], &dim)
		ids := readModelIDs(a.Params)
		item("model", fmt.Sprintf("%dD; lengths in %s, forces in %s", dim, ids.Length, ids.Force))
		var counts []string
		for _, k := range []string{"nodes", "members", "supports", "load_cases", "combinations", "materials", "sections"} {
			var list []json.RawMessage
			if json.Unmarshal(m[k], &list) == nil && len(list) > 0 {
				counts = append(counts, fmt.Sprintf("%d %s", len(list), strings.ReplaceAll(k, "_", " ")))
			}
		}
		item("contents", strings.Join(counts, ", "))
		if raw, ok := m["parameters"]; ok {
			item("model parameters", compactText(raw, 300))
		}
	}
	keys := make([]string, 0, len(p))
	for k := range p {
		if k != "model" {
			keys = append(keys, k)
		}
	}
	sort.Strings(keys)
	for _, k := range keys {
		item(k, compactText(p[k], 300))
	}
	b.WriteString("</dl>\n")
}

// compactText is raw JSON on one line, cut to limit characters.
func compactText(raw json.RawMessage, limit int) string {
	var c bytes.Buffer
	if json.Compact(&c, raw) != nil {
		return ""
	}
	s := c.String()
	if r := []rune(s); len(r) > limit {
		return string(r[:limit]) + " …"
	}
	return s
}

func reportWarnings(b *bytes.Buffer, result any) {
	raw, err := json.Marshal(result)
	if err != nil {
		return
	}
	var v struct {
		Warnings []json.RawMessage `json:"warnings"`
	}
	_ = json.Unmarshal(raw, &v)
	if len(v.Warnings) == 0 {
		b.WriteString("<p>No warnings.</p>\n")
		return
	}
	b.WriteString("<h3>Warnings</h3>\n<ul>\n")
	for _, w := range v.Warnings {
		var s string
		if json.Unmarshal(w, &s) != nil {
			s = compactText(w, 400)
		}
		fmt.Fprintf(b, "<li>%s</li>\n", html.EscapeString(s))
	}
	b.WriteString("</ul>\n")
}

func reportTable(b *bytes.Buffer, t table) {
	fmt.Fprintf(b, "<h3>%s</h3>\n<table class=\"g-table\">\n<thead><tr>", html.EscapeString(t.Title))
	for _, c := range t.Columns {
		fmt.Fprintf(b, "<th>%s</th>", html.EscapeString(c))
	}
	b.WriteString("</tr></thead>\n<tbody>\n")
	scale := columnScales(t)
	for r, row := range t.Rows {
		if r == reportRowLimit {
			break
		}
		b.WriteString("<tr>")
		for c, v := range row {
			switch x := v.(type) {
			case float64:
				if c < len(scale) && math.Abs(x) < 1e-9*scale[c] {
					x = 0 // round-off beside the column's figures (a reaction of 3e-12 kN)
				}
				fmt.Fprintf(b, "<td class=\"g-num\">%s</td>", html.EscapeString(shortNumber(x)))
			case *float64:
				if x == nil {
					b.WriteString("<td class=\"g-empty\">not checked</td>")
				} else {
					fmt.Fprintf(b, "<td class=\"g-num\">%s</td>", html.EscapeString(shortNumber(*x)))
				}
			default:
				fmt.Fprintf(b, "<td>%s</td>", html.EscapeString(fmt.Sprint(v)))
			}
		}
		b.WriteString("</tr>\n")
	}
	b.WriteString("</tbody></table>\n")
	if len(t.Rows) > reportRowLimit {
		fmt.Fprintf(b, "<p class=\"g-meta\">The first %d of %d rows; gusset run --csv DIR writes them all.</p>\n", reportRowLimit, len(t.Rows))
	}
}

// columnScales returns, for each column of a table, the largest
// magnitude among the columns in the same unit (the text in the header's
// parentheses: Rx and Ry of a reaction table share "kN"), so that
// round-off is judged against the figures it sits beside.
func columnScales(t table) []float64 {
	unit := func(c int) string {
		name := t.Columns[c]
		if i, j := strings.Index(name, "("), strings.LastIndex(name, ")"); i >= 0 && j > i {
			return name[i:j]
		}
		return name
	}
	byUnit := map[string]float64{}
	for _, row := range t.Rows {
		for c, v := range row {
			if x, ok := v.(float64); ok && c < len(t.Columns) {
				byUnit[unit(c)] = math.Max(byUnit[unit(c)], math.Abs(x))
			}
		}
	}
	scale := make([]float64, len(t.Columns))
	for c := range scale {
		scale[c] = byUnit[unit(c)]
	}
	return scale
}

// shortNumber prints four significant figures, without a negative zero.
func shortNumber(x float64) string {
	if x == 0 || math.Abs(x) < 5e-13 {
		return "0"
	}
	return strconv.FormatFloat(x, 'g', 4, 64)
}

// svgIDs finds the ids an SVG document defines.
var svgIDs = regexp.MustCompile(`\bid="([^"]+)"`)

// inlineSVG prepares a picture for inlining in HTML: the XML declaration
// dropped and its ids prefixed, so that two pictures' markers cannot
// collide.
func inlineSVG(doc, prefix string) string {
	if i := strings.Index(doc, "<svg"); i >= 0 {
		doc = doc[i:]
	}
	for _, m := range svgIDs.FindAllStringSubmatch(doc, -1) {
		id := m[1]
		doc = strings.ReplaceAll(doc, `id="`+id+`"`, `id="`+prefix+id+`"`)
		doc = strings.ReplaceAll(doc, `url(#`+id+`)`, `url(#`+prefix+id+`)`)
		doc = strings.ReplaceAll(doc, `href="#`+id+`"`, `href="#`+prefix+id+`"`)
	}
	return doc
}

// sweepCharts draws each metric of a one-parameter sweep against the
// parameter, with the refined optimum marked on the objective's chart.
func sweepCharts(sw *protocol.SweepResult) []string {
	if len(sw.Parameters) != 1 {
		return nil
	}
	names := map[string]bool{}
	for _, s := range sw.Steps {
		for k := range s.Metrics {
			names[k] = true
		}
	}
	var charts []string
	for _, metric := range sortedKeys(names) {
		series := render.Series{Name: metric + " at each step"}
		for _, s := range sw.Steps {
			v, ok := s.Metrics[metric]
			if !ok || s.Error != "" {
				v = math.NaN()
			}
			series.X = append(series.X, s.Values[0])
			series.Y = append(series.Y, v)
		}
		spec := render.ChartSpec{Title: metric + " against " + sw.Parameters[0], XLabel: sw.Parameters[0] + " (model units)",
			YLabel: metric + " (" + metricUnit(metric) + ")", Series: []render.Series{series}}
		if r := sw.Refinement; r != nil && len(r.Values) == 1 {
			if v, ok := r.Metrics[metric]; ok {
				spec.Optimum = &[2]float64{r.Values[0], v}
				spec.OptimumLabel = fmt.Sprintf("refined optimum (%s): %s at %s = %s", r.Method, shortNumber(v), sw.Parameters[0], shortNumber(r.Values[0]))
			}
		}
		var b bytes.Buffer
		if render.Chart(&b, spec) == nil {
			charts = append(charts, b.String())
		}
	}
	return charts
}

// metricUnit names a sweep metric's unit in the model's units.
func metricUnit(metric string) string {
	switch metric {
	case "volume":
		return "length³"
	case "mass":
		return "kg"
	case "carbon":
		return "kg CO2e"
	case "load_path", "tension_load_path", "compression_load_path":
		return "force·length"
	case "max_displacement":
		return "length"
	case "max_utilisation":
		return "ratio"
	}
	return "model units"
}
