package report

import (
	"bufio"
	"bytes"
	"encoding/base64"
	"encoding/json"
	"fmt"
	"image"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"
)

// The browser check renders the campaign report in headless Chromium
// (Debian's package chromium) and drives it through the DevTools protocol
// over a pipe (--remote-debugging-pipe: JSON messages separated by NUL
// bytes on file descriptors 3 and 4), so that console messages,
// exceptions and network requests are those of the page itself, not of
// the browser's own services. The test installs nothing: without Chromium
// it skips, unless CI_REQUIRE_CHROMIUM=1 (set by .ci/run, which installs
// the package), where a missing browser fails it.

// chromiumPath returns the browser to run, or skips (fails under
// CI_REQUIRE_CHROMIUM=1) without one.
func chromiumPath(t *testing.T) string {
	t.Helper()
	for _, name := range []string{"chromium", "chromium-browser", "google-chrome"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("CI_REQUIRE_CHROMIUM") == "1" {
		t.Fatal("CI_REQUIRE_CHROMIUM=1 but no chromium on PATH (.ci/run installs Debian's chromium)")
	}
	t.Skip("chromium not found: the browser check of the campaign report is skipped (apt-get install chromium to run it; CI does)")
	return ""
}

// devtools is a headless Chromium driven over --remote-debugging-pipe.
type devtools struct {
	t       *testing.T
	cmd     *exec.Cmd
	in      *os.File // the browser reads commands from it (its fd 3)
	mu      sync.Mutex
	nextID  int
	waiting map[int]chan cdpMessage
	events  []cdpMessage
	stderr  bytes.Buffer
}

type cdpMessage struct {
	ID        int             `json:"id,omitempty"`
	Method    string          `json:"method,omitempty"`
	Params    json.RawMessage `json:"params,omitempty"`
	Result    json.RawMessage `json:"result,omitempty"`
	Error     json.RawMessage `json:"error,omitempty"`
	SessionID string          `json:"sessionId,omitempty"`
}

// startBrowser launches Chromium headless with the DevTools pipe.
func startBrowser(t *testing.T, bin string) *devtools {
	t.Helper()
	d := &devtools{t: t, waiting: map[int]chan cdpMessage{}}
	cmdR, cmdW, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	evR, evW, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	args := []string{"--headless", "--remote-debugging-pipe", "--disable-gpu", "--no-first-run", "--no-default-browser-check",
		"--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-extensions",
		"--hide-scrollbars", "--user-data-dir=" + t.TempDir(),
		// No request leaves the machine: every URL goes to a proxy on
		// the loopback interface, and the host resolver resolves nothing
		// (not even the proxy, so every connection fails at once).
		"--proxy-server=http://127.0.0.1:1", "--proxy-bypass-list=<-loopback>",
		"--host-resolver-rules=MAP * ~NOTFOUND", "about:blank"}
	if os.Geteuid() == 0 {
		args = append([]string{"--no-sandbox"}, args...) // Chromium refuses root with its sandbox
	}
	d.cmd = exec.Command(bin, args...)
	d.cmd.ExtraFiles = []*os.File{cmdR, evW} // fds 3 and 4 of the browser
	d.cmd.Stderr = &d.stderr
	if err := d.cmd.Start(); err != nil {
		t.Fatalf("starting %s: %v", bin, err)
	}
	cmdR.Close()
	evW.Close()
	d.in = cmdW
	go d.read(evR)
	t.Cleanup(d.close)
	return d
}

func (d *devtools) read(r *os.File) {
	br := bufio.NewReader(r)
	for {
		b, err := br.ReadBytes(0)
		if err != nil {
			return
		}
		var m cdpMessage
		if json.Unmarshal(b[:len(b)-1], &m) != nil {
			continue
		}
		d.mu.Lock()
		if m.ID != 0 {
			if ch := d.waiting[m.ID]; ch != nil {
				ch <- m
			}
		} else {
			d.events = append(d.events, m)
		}
		d.mu.Unlock()
	}
}

// call sends a command and waits for its result.
func (d *devtools) call(session, method string, params any, result any) {
	d.t.Helper()
	d.mu.Lock()
	d.nextID++
	id := d.nextID
	ch := make(chan cdpMessage, 1)
	d.waiting[id] = ch
	d.mu.Unlock()
	msg := map[string]any{"id": id, "method": method}
	if params != nil {
		msg["params"] = params
	}
	if session != "" {
		msg["sessionId"] = session
	}
	b, _ := json.Marshal(msg)
	if _, err := d.in.Write(append(b, 0)); err != nil {
		d.t.Fatalf("%s: %v\n%s", method, err, tail(d.stderr.String(), 2000))
	}
	select {
	case m := <-ch:
		if len(m.Error) > 0 {
			d.t.Fatalf("%s: %s", method, m.Error)
		}
		if result != nil {
			if err := json.Unmarshal(m.Result, result); err != nil {
				d.t.Fatalf("%s: %v", method, err)
			}
		}
	case <-time.After(2 * time.Minute):
		d.t.Fatalf("%s: no answer from the browser\n%s", method, tail(d.stderr.String(), 2000))
	}
}

func (d *devtools) close() {
	if d.in != nil {
		b, _ := json.Marshal(map[string]any{"id": 1 << 30, "method": "Browser.close"})
		d.in.Write(append(b, 0))
		done := make(chan struct{})
		go func() { d.cmd.Wait(); close(done) }()
		select {
		case <-done:
		case <-time.After(20 * time.Second):
			d.cmd.Process.Kill()
			<-done
		}
		d.in.Close()
		d.in = nil
	}
}

// pageRun is what loading one page showed.
type pageRun struct {
	requests []string // URLs the page requested, its own file aside
	console  []string // console messages, exceptions and error log entries
	eval     string   // the value of the expression evaluated after load
	shot     image.Image
}

// visit opens url in a new 1200 × 1600 page, waits until it is loaded,
// evaluates expr and takes a screenshot of the viewport.
func (d *devtools) visit(url, expr string) pageRun {
	d.t.Helper()
	var target struct{ TargetID string }
	d.call("", "Target.createTarget", map[string]any{"url": "about:blank"}, &target)
	var att struct{ SessionID string }
	d.call("", "Target.attachToTarget", map[string]any{"targetId": target.TargetID, "flatten": true}, &att)
	s := att.SessionID
	for _, m := range []string{"Network.enable", "Runtime.enable", "Log.enable", "Page.enable"} {
		d.call(s, m, nil, nil)
	}
	d.call(s, "Emulation.setDeviceMetricsOverride", map[string]any{"width": 1200, "height": 1600, "deviceScaleFactor": 1, "mobile": false}, nil)
	d.mu.Lock()
	from := len(d.events)
	d.mu.Unlock()
	d.call(s, "Page.navigate", map[string]any{"url": url}, nil)
	// Loaded when the document at url is complete (the about:blank the
	// page started with may report its own load first).
	deadline := time.Now().Add(2 * time.Minute)
	for {
		var st struct {
			Result struct{ Value string }
		}
		d.call(s, "Runtime.evaluate", map[string]any{"expression": `location.href + " " + document.readyState`, "returnByValue": true}, &st)
		if st.Result.Value == url+" complete" {
			break
		}
		if time.Now().After(deadline) {
			d.t.Fatalf("%s: not loaded (%q)\n%s", url, st.Result.Value, tail(d.stderr.String(), 2000))
		}
		time.Sleep(50 * time.Millisecond)
	}
	var ev struct {
		Result struct{ Value any }
	}
	d.call(s, "Runtime.evaluate", map[string]any{"expression": expr, "returnByValue": true}, &ev)
	var shot struct{ Data string }
	d.call(s, "Page.captureScreenshot", map[string]any{"format": "png"}, &shot)
	raw, err := base64.StdEncoding.DecodeString(shot.Data)
	if err != nil {
		d.t.Fatalf("screenshot: %v", err)
	}
	img, err := png.Decode(bytes.NewReader(raw))
	if err != nil {
		d.t.Fatalf("screenshot: %v", err)
	}
	run := pageRun{eval: fmt.Sprint(ev.Result.Value), shot: img}
	d.mu.Lock()
	events := append([]cdpMessage(nil), d.events[from:]...)
	d.mu.Unlock()
	for _, e := range events {
		if e.SessionID != s {
			continue
		}
		switch e.Method {
		case "Network.requestWillBeSent":
			var p struct{ Request struct{ URL string } }
			json.Unmarshal(e.Params, &p)
			if p.Request.URL != url {
				run.requests = append(run.requests, p.Request.URL)
			}
		case "Runtime.consoleAPICalled":
			var p struct {
				Type string
				Args []struct{ Value any }
			}
			json.Unmarshal(e.Params, &p)
			run.console = append(run.console, fmt.Sprintf("console.%s %v", p.Type, p.Args))
		case "Runtime.exceptionThrown":
			var p struct {
				ExceptionDetails struct {
					Text      string
					Exception struct{ Description string }
				}
			}
			json.Unmarshal(e.Params, &p)
			run.console = append(run.console, "exception: "+p.ExceptionDetails.Text+" "+p.ExceptionDetails.Exception.Description)
		case "Log.entryAdded":
			var p struct {
				Entry struct{ Level, Text, URL string }
			}
			json.Unmarshal(e.Params, &p)
			if p.Entry.Level == "error" {
				run.console = append(run.console, "log error: "+p.Entry.Text+" "+p.Entry.URL)
			}
		}
	}
	d.call("", "Target.closeTarget", map[string]any{"targetId": target.TargetID}, nil)
	return run
}

func tail(s string, n int) string {
	if len(s) > n {
		return "…" + s[len(s)-n:]
	}
	return s
}

// TestCampaignReportInChromium renders the campaign report in headless
// Chromium and checks that the page logs nothing to the console (no
// message, no exception, no error entry), requests no URL besides its own
// file, runs its script to the end (the readout line records the grid
// cells it serves) and paints: the screenshot of its first 1200 × 1600
// pixels is not blank and shows the Okabe–Ito colour of every class in the
// verdict grid. A canary page with a console error, an uncaught exception
// and an external image shows that each check catches what it is for.
func TestCampaignReportInChromium(t *testing.T) {
	bin := chromiumPath(t)
	f := campaignHTML(t)
	dir := t.TempDir()
	b := startBrowser(t, bin)

	canary := filepath.Join(dir, "canary.html")
	if err := os.WriteFile(canary, []byte(`<!DOCTYPE html><html><body><p>canary</p><img src="http://example.invalid/x.png" alt=""/><script>console.error("canary"); missingFunction();</script></body></html>`), 0o644); err != nil {
		t.Fatal(err)
	}
	c := b.visit("file://"+canary, "1")
	all := strings.Join(c.console, "\n")
	if !strings.Contains(all, "console.error") || !strings.Contains(all, "missingFunction") {
		t.Errorf("canary: console %q, want its console.error and its uncaught exception", c.console)
	}
	if !mentions(c.requests, "example.invalid") {
		t.Errorf("canary: requests %q, want the one for example.invalid", c.requests)
	}

	page := filepath.Join(dir, "report.html")
	if err := os.WriteFile(page, f.html, 0o644); err != nil {
		t.Fatal(err)
	}
	r := b.visit("file://"+page, `document.getElementById("grid-readout").getAttribute("data-cells")`)
	if len(r.console) > 0 {
		t.Errorf("console: %q", r.console)
	}
	if len(r.requests) > 0 {
		t.Errorf("the page requested %q", r.requests)
	}
	if want := fmt.Sprint(len(f.rep.Verdicts)); r.eval != want {
		t.Errorf("the page's script did not run to the end: data-cells = %q, want %s", r.eval, want)
	}
	img := r.shot
	bd := img.Bounds()
	if bd.Dx() != 1200 || bd.Dy() != 1600 {
		t.Errorf("screenshot %v, want 1200 × 1600", bd)
	}
	inked := 0
	colours := map[string]int{}
	classes := map[string]bool{}
	for _, v := range f.rep.Verdicts {
		classes[v.Class] = true
	}
	for y := bd.Min.Y; y < bd.Max.Y; y++ {
		for x := bd.Min.X; x < bd.Max.X; x++ {
			cr, cg, cb, _ := img.At(x, y).RGBA()
			if cr>>8 < 250 || cg>>8 < 250 || cb>>8 < 250 {
				inked++
			}
			for cl := range classes {
				if near(img, x, y, verdictColour(cl)) {
					colours[cl]++
				}
			}
		}
	}
	// A blank page inks nothing; the header, the caution and the grid
	// fill far more than 2 % of the first screen (8.6 % on this fixture).
	frac := float64(inked) / float64(bd.Dx()*bd.Dy())
	t.Logf("screenshot: %.1f %% of pixels inked; pixels of the class colours %v", 100*frac, colours)
	if frac < 0.02 {
		t.Errorf("screenshot nearly blank: %.2f %% of pixels inked", 100*frac)
	}
	// Every class's colour fills at least one grid cell (about 60 × 25 px).
	for cl := range classes {
		if colours[cl] < 500 {
			t.Errorf("class %s: %d pixels of its colour %s in the screenshot, want a grid cell's worth", cl, colours[cl], verdictColour(cl))
		}
	}
}

// near reports whether the pixel at (x, y) has the colour hex (#RRGGBB)
// within 6 levels per channel (CSS backgrounds paint the exact colour;
// the margin allows for colour management).
func near(img image.Image, x, y int, hex string) bool {
	var cr, cg, cb int
	fmt.Sscanf(hex, "#%02x%02x%02x", &cr, &cg, &cb)
	r, g, b, _ := img.At(x, y).RGBA()
	d := func(a uint32, c int) bool { v := int(a>>8) - c; return v >= -6 && v <= 6 }
	return d(r, cr) && d(g, cg) && d(b, cb)
}

// mentions reports whether some request names host.
func mentions(reqs []string, host string) bool {
	for _, r := range reqs {
		if strings.Contains(r, host) {
			return true
		}
	}
	return false
}
