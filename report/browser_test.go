package report

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	stdhtml "html"
	"image"
	"image/png"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"syscall"
	"testing"
	"time"

	"rockheat"
	"rockheat/scenarios"
)

// chromium returns the path of a headless Chromium: $ROCKHEAT_CHROMIUM, or
// Debian's chromium on the PATH. Without one the browser tests skip, except
// under CI (CI=true), where a missing browser fails them: .ci/run installs
// it.
func chromium(t *testing.T) string {
	t.Helper()
	if p := os.Getenv("ROCKHEAT_CHROMIUM"); p != "" {
		return p
	}
	for _, name := range []string{"chromium", "chromium-browser"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("CI") == "true" {
		t.Fatal("no headless Chromium: install Debian's chromium package (apt-get install chromium), as .ci/run does")
	}
	t.Skip("no headless Chromium on this machine (apt-get install chromium); CI runs this test")
	return ""
}

// headless runs Chromium on the page at path with extra flags and returns
// its standard output. A browser that crashes (killed by a signal, as
// Chromium sometimes is on a loaded machine) is started once more; a
// second crash fails the test.
func headless(t *testing.T, browser, path string, flags ...string) []byte {
	t.Helper()
	var err error
	var stderr bytes.Buffer
	for try := 0; try < 2; try++ {
		ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
		args := append([]string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
			"--disable-background-networking", "--disable-component-update", "--disable-sync",
			"--disable-dev-shm-usage", "--user-data-dir=" + t.TempDir()}, flags...)
		cmd := exec.CommandContext(ctx, browser, append(args, "file://"+path)...)
		var stdout bytes.Buffer
		stderr.Reset()
		cmd.Stdout, cmd.Stderr = &stdout, &stderr
		err = cmd.Run()
		cancel()
		if err == nil {
			return stdout.Bytes()
		}
		var ee *exec.ExitError
		if !errors.As(err, &ee) || !ee.ProcessState.Sys().(syscall.WaitStatus).Signaled() {
			break
		}
	}
	t.Fatalf("chromium: %v\n%s", err, stderr.String())
	return nil
}

// probeScripts are added to a copy of a page: the first records every
// error (scripts, and resources, in the capture phase), the second writes
// the size of every chart and the errors into <pre id="probe"> once the
// page has loaded. The reports themselves carry no script.
const (
	probeHead = `<script>window.__errors = []; window.addEventListener("error", function (e) { window.__errors.push(String(e.message || e.target && e.target.outerHTML)); }, true);</script>`
	probeBody = `<script>window.addEventListener("load", function () {
var sizes = Array.prototype.map.call(document.querySelectorAll("svg"), function (s) { var b = s.getBoundingClientRect(); return [b.width, b.height]; });
var p = document.createElement("pre"); p.id = "probe"; p.textContent = JSON.stringify({charts: sizes, errors: window.__errors});
document.body.appendChild(p); });</script>`
)

var probeRE = regexp.MustCompile(`(?s)<pre id="probe">(.*?)</pre>`)

// TestPagesInBrowser renders the HTML pages of a run, a hot-rock run and a
// portfolio in a real browser and checks that each loads without errors,
// that every chart has a size, and that a screenshot of it is not blank.
func TestPagesInBrowser(t *testing.T) {
	browser := chromium(t)
	dir := t.TempDir()
	pages := map[string]func() ([]byte, int){
		"run":      func() ([]byte, int) { return renderPage(t, HTML, demoResult(t)), 4 },
		"hot-rock": func() ([]byte, int) { return renderPage(t, HTML, hotRockResult(t)), 5 },
		"portfolio": func() ([]byte, int) {
			pf, err := scenarios.LoadPortfolio("licence-demo")
			if err != nil {
				t.Fatal(err)
			}
			res, err := rockheat.EstimatePortfolio(&pf.Portfolio, rockheat.Options{Trials: 5000})
			if err != nil {
				t.Fatal(err)
			}
			return renderPage(t, PortfolioHTML, res), 2
		},
	}
	for name, build := range pages {
		t.Run(name, func(t *testing.T) {
			html, charts := build()
			path := filepath.Join(dir, name+".html")
			probe := strings.Replace(strings.Replace(string(html), "<head>", "<head>"+probeHead, 1), "</body>", probeBody+"</body>", 1)
			if err := os.WriteFile(path, []byte(probe), 0o644); err != nil {
				t.Fatal(err)
			}
			dom := headless(t, browser, path, "--dump-dom", "--virtual-time-budget=5000")
			m := probeRE.FindSubmatch(dom)
			if m == nil {
				t.Fatalf("the page did not finish loading (no probe in the DOM):\n%.2000s", dom)
			}
			var got struct {
				Charts [][2]float64
				Errors []string
			}
			if err := json.Unmarshal([]byte(stdhtml.UnescapeString(string(m[1]))), &got); err != nil {
				t.Fatalf("probe %s: %v", m[1], err)
			}
			if len(got.Errors) > 0 {
				t.Errorf("errors while loading: %q", got.Errors)
			}
			if len(got.Charts) != charts {
				t.Errorf("%d charts on the page, want %d", len(got.Charts), charts)
			}
			for i, c := range got.Charts {
				if !(c[0] > 100 && c[1] > 100) {
					t.Errorf("chart %d is %g × %g px", i, c[0], c[1])
				}
			}
			plain := filepath.Join(dir, name+"-plain.html")
			os.WriteFile(plain, html, 0o644)
			shot := filepath.Join(dir, name+".png")
			headless(t, browser, plain, "--screenshot="+shot, "--window-size=1200,2400", "--hide-scrollbars")
			if err := notBlank(shot); err != nil {
				t.Error(err)
			}
		})
	}
}

func renderPage[R any](t *testing.T, render func(w io.Writer, r R) error, r R) []byte {
	t.Helper()
	var b bytes.Buffer
	if err := render(&b, r); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// notBlank reports an error unless the PNG at path has both light and
// dark pixels in quantity: text, tables and charts, not an empty page.
func notBlank(path string) error {
	f, err := os.Open(path)
	if err != nil {
		return err
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		return fmt.Errorf("screenshot %s: %w", path, err)
	}
	dark, total := 0, 0
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 2 {
		for x := b.Min.X; x < b.Max.X; x += 2 {
			total++
			if lum(img, x, y) < 0.5 {
				dark++
			}
		}
	}
	if frac := float64(dark) / float64(total); frac < 0.005 || frac > 0.6 {
		return fmt.Errorf("screenshot %s has %.2f%% dark pixels: blank or unrendered", path, 100*frac)
	}
	return nil
}

func lum(img image.Image, x, y int) float64 {
	r, g, b, _ := img.At(x, y).RGBA()
	return (0.2126*float64(r) + 0.7152*float64(g) + 0.0722*float64(b)) / 0xffff
}
