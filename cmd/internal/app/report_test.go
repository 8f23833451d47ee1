package app

import (
	"context"
	"encoding/json"
	"fmt"
	"image/color"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
	"time"

	"finmarch/cmd/internal/demo"
)

// hostile is a design whose name holds markup and script.
const hostileName = `<script>document.title="pwned"</script><img src=x onerror="document.title='pwned'">Bad & "quoted"`

func reportFiles(t *testing.T) (string, string) {
	dir := t.TempDir()
	up, lo := designs(t)
	bad := filepath.Join(dir, "hostile.toml")
	src := strings.Replace(string(demo.LaidOver), `name = "demo single, laid over, longitudinal fins"`, `name = `+strconv.Quote(hostileName), 1)
	// and over its limit, for the Warnings section
	src = strings.Replace(src, `head = "220 C"`, `head = "150 C"`, 1)
	if err := os.WriteFile(bad, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "report.html")
	if _, errs, code := run(t, "report", up, lo, bad, "-o", out); code != 0 {
		t.Fatalf("report: exit %d: %s", code, errs)
	}
	return out, up
}

// The report is self-contained (no scripts, no external resources), every
// user-supplied string is escaped, and it carries the key numbers, the
// warnings section, the sources and the caution.
func TestReportContent(t *testing.T) {
	path, up := reportFiles(t)
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	if strings.Contains(strings.ToLower(s), "<script") {
		t.Error("report holds a script element")
	}
	if strings.Contains(s, "onerror=") && !strings.Contains(s, "onerror=&#34;") {
		t.Error("an attribute from the design name reached the markup")
	}
	// no network: only the SVG namespace URIs may look like addresses
	for _, m := range regexp.MustCompile(`<[a-zA-Z][^<>]*\s(src|href)\s*=\s*["']?([^"' >]+)`).FindAllStringSubmatch(s, -1) {
		t.Errorf("external reference %s=%s", m[1], m[2])
	}
	for _, u := range regexp.MustCompile(`https?://[^"' <]+`).FindAllString(s, -1) {
		if !strings.HasPrefix(u, "http://www.w3.org/") {
			t.Errorf("network address in the report: %s", u)
		}
	}
	if !strings.Contains(s, "&lt;script&gt;document.title=") {
		t.Error("the hostile name does not appear as escaped text")
	}
	// the key numbers: the head temperature the estimate prints
	est, _, _ := run(t, "estimate", up)
	m := regexp.MustCompile(`wall temperature at fin roots\s+\| C\s+\|\s+([0-9.]+) \|`).FindStringSubmatch(est)
	if m == nil {
		t.Fatalf("no head temperature in the estimate:\n%s", est)
	}
	if !strings.Contains(s, ">"+m[1]+"<") {
		t.Errorf("report lacks the head temperature %s", m[1])
	}
	// the version line, and a design over its limit in the Warnings section
	// (the section once said nothing was wrong while a design was over it)
	if !regexp.MustCompile(`id="made">Written by finmarch [^<]*go1\.[^<]* on 20[0-9-]+ [0-9:]+ UTC; command: finmarch report`).MatchString(s) {
		t.Error("report lacks its version, date and command line")
	}
	if w := s[strings.Index(s, `id="warnings"`):]; !strings.Contains(w[:strings.Index(w, "</section>")], "Over a limit:</strong>") {
		t.Error("the Warnings section does not name the design over its limit")
	}
	for _, want := range []string{"not a measurement", "Model and sources", "Warnings", "<svg", "Comparison", "Inputs", "Stephan", "@media print"} {
		if !strings.Contains(s, want) {
			t.Errorf("report lacks %q", want)
		}
	}
}

// chromiumPath finds Debian's chromium; CI installs it (.ci/run).
func chromiumPath(t *testing.T) string {
	for _, p := range []string{"/usr/bin/chromium", "/usr/bin/chromium-browser"} {
		if _, err := os.Stat(p); err == nil {
			return p
		}
	}
	if os.Getenv("CI") != "" {
		t.Fatal("chromium is not installed; .ci/run installs Debian's chromium package")
	}
	t.Skip("chromium not installed (apt-get install chromium); CI runs this test")
	return ""
}

func chromium(t *testing.T, bin, profile string, args ...string) (string, string) {
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	base := []string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-extensions",
		"--user-data-dir=" + profile, "--enable-logging=stderr", "--v=0"}
	cmd := exec.CommandContext(ctx, bin, append(base, args...)...)
	var out, errb strings.Builder
	cmd.Stdout, cmd.Stderr = &out, &errb
	if err := cmd.Run(); err != nil {
		t.Fatalf("chromium %v: %v\n%s", args, err, errb.String())
	}
	return out.String(), errb.String()
}

// The report opens in a real browser (headless Chromium): it renders with
// no console errors, the DOM holds the key numbers and the escaped hostile
// name as text (the page title unchanged by it), and a screenshot is saved
// under the test's temporary folder.
func TestReportInBrowser(t *testing.T) {
	bin := chromiumPath(t)
	path, _ := reportFiles(t)
	dir := filepath.Dir(path)
	url := "file://" + path
	dom, logs := chromium(t, bin, filepath.Join(dir, "profile-dom"), "--virtual-time-budget=3000", "--dump-dom", url)
	for _, l := range strings.Split(logs, "\n") {
		if strings.Contains(l, ":CONSOLE") || strings.Contains(l, "Uncaught") {
			t.Errorf("console message: %s", l)
		}
	}
	if !strings.Contains(dom, "<title>finmarch report:") || strings.Contains(dom, "<title>pwned") {
		t.Errorf("page title changed or missing: %.300s", dom)
	}
	if strings.Contains(dom, "<img") {
		t.Error("the hostile name produced an element")
	}
	if !strings.Contains(dom, "&lt;script&gt;document.title=") {
		t.Error("the hostile name is not shown as text")
	}
	for _, want := range []string{"not a measurement", "head temperature", "Model and sources", "<svg"} {
		if !strings.Contains(dom, want) {
			t.Errorf("rendered page lacks %q", want)
		}
	}
	// as rendered: the version line, and the design over its limit named in
	// the Warnings section
	if !regexp.MustCompile(`id="made"[^>]*>Written by finmarch [^<]*UTC; command: finmarch report`).MatchString(dom) {
		t.Error("the rendered page lacks its version, date and command line")
	}
	if i := strings.Index(dom, `id="warnings"`); i < 0 || !strings.Contains(dom[i:i+strings.Index(dom[i:], "</section>")], "Over a limit:") {
		t.Error("the rendered Warnings section does not name the design over its limit")
	}
	shot := filepath.Join(dir, "report.png")
	chromium(t, bin, filepath.Join(dir, "profile-shot"), "--hide-scrollbars", "--window-size=1280,2400", "--screenshot="+shot, url)
	f, err := os.Open(shot)
	if err != nil {
		t.Fatalf("screenshot missing: %v", err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("screenshot: %v", err)
	}
	// a rendered page, not a blank or an error page: many colours (text,
	// tables, the plots' lines and fills) over the whole height
	colours := map[color.Color]bool{}
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 3 {
		for x := b.Min.X; x < b.Max.X; x += 3 {
			colours[img.At(x, y)] = true
		}
	}
	if b.Dy() < 2000 || len(colours) < 50 {
		t.Errorf("screenshot %dx%d with %d colours: blank or unstyled", b.Dx(), b.Dy(), len(colours))
	}
	t.Logf("screenshot: %s (%d colours)", shot, len(colours))
}

// The report's first screen holds every design's headline (issue 22): in
// headless Chromium with a 1280 x 800 window (a viewport of about 1280 x
// 657 once the window's own bars are taken), each design's headline row
// (head temperature, band, limit, margin, chance over, barrel temperature
// and margin, status) lies wholly inside the viewport, and the head rows carry the temperatures 'estimate' gives.
// A script added to a copy of the page measures the rows and writes the
// verdict into the title, which --dump-dom returns.
func TestReportHeadlineOnFirstScreen(t *testing.T) {
	bin := chromiumPath(t)
	path, up := reportFiles(t)
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	probe := `<script>addEventListener("load", () => {
  const rows = [...document.querySelectorAll("#headline tbody tr")];
  const low = rows.filter(r => r.getBoundingClientRect().bottom > innerHeight || r.getBoundingClientRect().right > innerWidth);
  document.title = (low.length ? "HEADLINE-LOW " + low.length : "HEADLINE-OK") + " " + rows.length + " " + innerWidth + "x" + innerHeight;
});</script></body>`
	page := filepath.Join(filepath.Dir(path), "probe.html")
	if err := os.WriteFile(page, []byte(strings.Replace(string(b), "</body>", probe, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	dom, _ := chromium(t, bin, filepath.Join(filepath.Dir(path), "profile-probe"), "--window-size=1280,800", "--virtual-time-budget=3000", "--dump-dom", "file://"+page)
	if !regexp.MustCompile(`<title>HEADLINE-OK 3 1280x\d+</title>`).MatchString(dom) {
		i := strings.Index(dom, "<title>")
		t.Errorf("the headline is not on the first screen: %.80s", dom[i:])
	}
	// the headline's head temperature of the upright demo is estimate's
	js, errs, code := run(t, "estimate", up, "-f", "json", "-q", "--samples", "0")
	if code != 0 {
		t.Fatal(errs)
	}
	var v struct {
		Result struct {
			Head struct {
				Wall float64 `json:"wall_temperature_K"`
			} `json:"head"`
		} `json:"result"`
	}
	if err := json.Unmarshal([]byte(js), &v); err != nil {
		t.Fatal(err)
	}
	i := strings.Index(string(b), `id="headline"`)
	j := strings.Index(string(b)[i:], "</section>")
	if i < 0 || !strings.Contains(string(b)[i:i+j], fmt.Sprintf(">%.1f<", v.Result.Head.Wall-273.15)) {
		t.Errorf("the headline lacks the upright head's %.1f C", v.Result.Head.Wall-273.15)
	}
}
