package main

import (
	"bytes"
	"context"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"
)

// reportInput is a run file exercising every table and picture the report
// lays out: solve, reciprocate (with its picture), load-path, a sweep
// with its chart, a layout, and a failing request.
func reportInput(t *testing.T) string {
	var b strings.Builder
	for _, name := range []string{"two-bar.in.jsonl", "triangle-reciprocal.in.jsonl", "two-bar-load-path.in.jsonl", "two-bar-sweep.in.jsonl", "layout-two-bar.in.jsonl"} {
		b.WriteString(readTranscript(t, name))
		b.WriteString("\n")
	}
	b.WriteString(`{"jsonrpc":"2.0","id":"broken","method":"solve","params":{"model":{"dimension":2,"materials":[],"sections":[],"nodes":[],"members":[]}}}` + "\n")
	return b.String()
}

// TestReportSelfContained checks report.html from `gusset run --report`:
// one page with the title, the caution, every request's section, inline
// SVG pictures and charts, tables with units, the error's pointer, and
// nothing fetched from elsewhere (no scripts, no external links, styles
// or images).
func TestReportSelfContained(t *testing.T) {
	dir := t.TempDir()
	code, _, errOut := runCapture([]string{"run", "-", "--report", dir}, reportInput(t))
	if code != 1 { // the broken request fails
		t.Fatalf("exit %d, want 1: %s", code, errOut)
	}
	page, err := os.ReadFile(filepath.Join(dir, "report.html"))
	if err != nil {
		t.Fatal(err)
	}
	doc := string(page)
	for _, want := range []string{"<title>Gusset report</title>", "qualified engineer", "1: solve", "tri: reciprocate",
		"axial force (kN, tension +)", "<svg", "against", "Error", "/params/model", "@media print"} {
		if !strings.Contains(doc, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	external := regexp.MustCompile(`(?i)<script|<link|<iframe|<img|(src|href)="(https?:|//|file:)|url\((https?:|//)|@import`)
	if m := external.FindString(doc); m != "" {
		t.Errorf("report is not self-contained: %q", m)
	}
	if n := strings.Count(doc, "<svg"); n < 3 {
		t.Errorf("%d inline pictures, want the reciprocal picture, the layout and the sweep charts", n)
	}
	// Each id is defined once across the inlined pictures.
	ids := map[string]int{}
	for _, m := range svgIDs.FindAllStringSubmatch(doc, -1) {
		ids[m[1]]++
	}
	for id, n := range ids {
		if n > 1 {
			t.Errorf("id %q defined %d times", id, n)
		}
	}
	browserCheck(t, filepath.Join(dir, "report.html"), "Gusset report")
}

// browserCheck opens a page in headless Chromium (Debian's package,
// installed by .ci/run): a screenshot must not be blank, the rendered
// document must carry the title, and the browser must log no console
// error. It skips when Chromium is absent, unless GUSSET_REQUIRE_CLIENTS
// is set (as in CI).
func browserCheck(t *testing.T, page, title string) {
	t.Helper()
	browser := ""
	for _, name := range []string{"chromium", "chromium-browser"} {
		if p, err := exec.LookPath(name); err == nil {
			browser = p
			break
		}
	}
	if browser == "" {
		if os.Getenv("GUSSET_REQUIRE_CLIENTS") != "" {
			t.Fatal("chromium is not installed (GUSSET_REQUIRE_CLIENTS is set); .ci/run installs it")
		}
		t.Skip("chromium is not installed")
	}
	abs, err := filepath.Abs(page)
	if err != nil {
		t.Fatal(err)
	}
	shot := filepath.Join(t.TempDir(), "shot.png")
	profile := t.TempDir()
	common := []string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--no-first-run",
		"--user-data-dir=" + profile, "--enable-logging=stderr", "--v=0", "--window-size=1280,1600"}
	ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, browser, append(common, "--screenshot="+shot, "file://"+abs)...)
	var log bytes.Buffer
	cmd.Stderr = &log
	if err := cmd.Run(); err != nil {
		t.Fatalf("chromium --screenshot: %v\n%s", err, log.String())
	}
	dom := exec.CommandContext(ctx, browser, append(common, "--dump-dom", "file://"+abs)...)
	var domLog bytes.Buffer
	dom.Stderr = &domLog
	rendered, err := dom.Output()
	if err != nil {
		t.Fatalf("chromium --dump-dom: %v\n%s", err, domLog.String())
	}
	if !strings.Contains(string(rendered), "<title>"+title+"</title>") {
		t.Errorf("rendered page lacks the title %q", title)
	}
	for _, l := range strings.Split(log.String()+domLog.String(), "\n") {
		if strings.Contains(l, "CONSOLE") && (strings.Contains(l, "ERROR") || strings.Contains(strings.ToLower(l), "error")) {
			t.Errorf("console error: %s", l)
		}
	}
	f, err := os.Open(shot)
	if err != nil {
		t.Fatalf("no screenshot: %v\n%s", err, log.String())
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	bounds := img.Bounds()
	ink, colours := 0, map[[3]uint32]bool{}
	for y := bounds.Min.Y; y < bounds.Max.Y; y += 2 {
		for x := bounds.Min.X; x < bounds.Max.X; x += 2 {
			r, g, b, _ := img.At(x, y).RGBA()
			if r < 0xf000 || g < 0xf000 || b < 0xf000 {
				ink++
			}
			colours[[3]uint32{r >> 12, g >> 12, b >> 12}] = true
		}
	}
	total := (bounds.Dx() / 2) * (bounds.Dy() / 2)
	if ink < total/100 || len(colours) < 8 {
		t.Errorf("screenshot looks blank: %d of %d sampled pixels inked, %d colours", ink, total, len(colours))
	}
}
