package watchcmd

// Browser tests: Debian's chromium, headless, driven through the DevTools
// protocol (chromedp). They load the report as a file and the live view
// from a test server, and check what a reader would: no console errors,
// no request to anywhere else, the diagram and tables on screen, and the
// live page following the model file.

import (
	"context"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/chromedp/cdproto/cdp"
	"github.com/chromedp/cdproto/emulation"
	"github.com/chromedp/cdproto/log"
	"github.com/chromedp/cdproto/network"
	"github.com/chromedp/cdproto/runtime"
	"github.com/chromedp/chromedp"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/reportcmd"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"net/http/httptest"
)

const chromium = "/usr/bin/chromium"

// browser starts a headless chromium with a fresh profile and no outside
// network traffic of its own. It skips only when chromium is missing and
// the tests do not run in CI (CI unset); in CI a missing browser fails.
func browser(t *testing.T) (context.Context, *pageLog) {
	t.Helper()
	if _, err := os.Stat(chromium); err != nil {
		if os.Getenv("CI") == "" {
			t.Skipf("browser tests skipped: %s is not installed (apt-get install chromium); they always run when CI is set", chromium)
		}
		t.Fatalf("CI is set but %s is missing: %v", chromium, err)
	}
	opts := []chromedp.ExecAllocatorOption{
		chromedp.ExecPath(chromium),
		chromedp.Headless,
		chromedp.NoSandbox,
		chromedp.DisableGPU,
		chromedp.NoFirstRun,
		chromedp.NoDefaultBrowserCheck,
		chromedp.Flag("disable-quic", true),
		chromedp.Flag("disable-background-networking", true),
		chromedp.Flag("disable-component-update", true),
		chromedp.Flag("disable-sync", true),
		chromedp.UserDataDir(t.TempDir()),
		chromedp.WindowSize(1200, 900),
	}
	// A bound on the whole test, so that a hung browser fails it rather
	// than the run: not an assertion on speed.
	ctx, cancelTimeout := context.WithTimeout(context.Background(), 3*time.Minute)
	alloc, cancelAlloc := chromedp.NewExecAllocator(ctx, opts...)
	bctx, cancelBrowser := chromedp.NewContext(alloc)
	t.Cleanup(func() { cancelBrowser(); cancelAlloc(); cancelTimeout() })
	pl := &pageLog{}
	require.NoError(t, chromedp.Listen(bctx, pl.record))
	_, err := chromedp.Call(bctx, network.Enable, network.EnableParams{})
	require.NoError(t, err)
	_, err = chromedp.Call(bctx, log.Enable, cdp.Empty{})
	require.NoError(t, err)
	_, err = chromedp.Call(bctx, runtime.Enable, cdp.Empty{})
	require.NoError(t, err)
	return bctx, pl
}

// pageLog gathers what a page did: console errors, uncaught exceptions,
// log entries of level error, and every request it sent.
type pageLog struct {
	mu       sync.Mutex
	errors   []string
	requests []string
}

func (p *pageLog) record(ev any) {
	p.mu.Lock()
	defer p.mu.Unlock()
	switch ev := ev.(type) {
	case *runtime.EventConsoleAPICalled:
		if ev.Type == runtime.ConsoleAPICalledTypeError || ev.Type == runtime.ConsoleAPICalledTypeWarning {
			var parts []string
			for _, a := range ev.Args {
				parts = append(parts, string(a.Value))
			}
			p.errors = append(p.errors, "console: "+strings.Join(parts, " "))
		}
	case *runtime.EventExceptionThrown:
		p.errors = append(p.errors, "exception: "+ev.ExceptionDetails.Text)
	case *log.EventEntryAdded:
		if ev.Entry.Level == log.EntryLevelError || ev.Entry.Level == log.EntryLevelWarning {
			p.errors = append(p.errors, "log: "+ev.Entry.Text+" "+ev.Entry.URL)
		}
	case *network.EventRequestWillBeSent:
		p.requests = append(p.requests, ev.Request.URL)
	}
}

func (p *pageLog) snapshot() (errs, reqs []string) {
	p.mu.Lock()
	defer p.mu.Unlock()
	return append([]string(nil), p.errors...), append([]string(nil), p.requests...)
}

// boxes returns the width × height of the first element of each selector.
func boxes(t *testing.T, ctx context.Context, selectors ...string) map[string][2]float64 {
	t.Helper()
	out := map[string][2]float64{}
	for _, sel := range selectors {
		js := `(function(){ const e = document.querySelector(` + jsString(sel) + `); if (!e) return [0, 0]; const r = e.getBoundingClientRect(); return [r.width, r.height]; })()`
		wh, err := chromedp.Run(ctx, chromedp.Evaluate[[2]float64](js))
		require.NoError(t, err)
		out[sel] = wh
	}
	return out
}

func jsString(s string) string { return "'" + strings.ReplaceAll(s, "'", `\'`) + "'" }

func TestBrowserReportOffline(t *testing.T) {
	ctx, pl := browser(t)
	dir := t.TempDir()
	path := filepath.Join(dir, "box.yaml")
	require.NoError(t, os.WriteFile(path, []byte(model("<script>alert(1)</script> review")), 0o644))
	page, _, err := reportcmd.Build(path, 0, false)
	require.NoError(t, err)
	html := filepath.Join(dir, "review.html")
	require.NoError(t, os.WriteFile(html, page, 0o644))
	url := "file://" + html

	require.NoError(t, chromedp.Do(ctx, chromedp.Navigate(url), chromedp.WaitVisible("#results")))
	h1, err := chromedp.Run(ctx, chromedp.Text("h1"))
	require.NoError(t, err)
	assert.Equal(t, "<script>alert(1)</script> review", h1, "the title shows as text")
	for sel, wh := range boxes(t, ctx, "#diagram svg", "#results", "#links", "#breakdown", "#balance", "#cautions") {
		assert.Greater(t, wh[0], 0.0, "%s width", sel)
		assert.Greater(t, wh[1], 0.0, "%s height", sel)
	}
	errs, reqs := pl.snapshot()
	assert.Empty(t, errs, "console errors")
	for _, r := range reqs {
		assert.Equal(t, url, r, "the report requests nothing but itself")
	}
	assert.NotEmpty(t, reqs, "network events are seen")
}

// The report prints on A4 and on Letter: in print media, at the width of
// an A4 page less its 15 mm margins (180 mm, 680 CSS px), nothing sticks
// out sideways; and chromium prints it to PDF on both papers.
func TestBrowserReportPrints(t *testing.T) {
	ctx, pl := browser(t)
	dir := t.TempDir()
	path := filepath.Join(dir, "box.yaml")
	data, err := os.ReadFile("../../../../examples/outdoor-controller.yaml")
	require.NoError(t, err)
	require.NoError(t, os.WriteFile(path, data, 0o644))
	page, _, err := reportcmd.Build(path, 0, false)
	require.NoError(t, err)
	html := filepath.Join(dir, "review.html")
	require.NoError(t, os.WriteFile(html, page, 0o644))

	_, err = chromedp.Call(ctx, emulation.SetEmulatedMedia, emulation.SetEmulatedMediaParams{Media: "print"})
	require.NoError(t, err)
	require.NoError(t, chromedp.Do(ctx, chromedp.EmulateViewport(680, 1000), chromedp.Navigate("file://"+html), chromedp.WaitVisible("#results")))
	widths, err := chromedp.Run(ctx, chromedp.Evaluate[[3]float64](`[document.documentElement.scrollWidth, document.documentElement.clientWidth, document.querySelector("#diagram svg").getBoundingClientRect().width]`))
	require.NoError(t, err)
	assert.LessOrEqual(t, widths[0], widths[1], "the page is no wider than the paper")
	assert.LessOrEqual(t, widths[2], 680.0, "the diagram fits the paper's width")
	assert.Greater(t, widths[2], 100.0)
	for _, paper := range []chromedp.PaperSize{chromedp.PaperA4, chromedp.PaperLetter} {
		pdf, err := chromedp.Run(ctx, chromedp.PrintToPDF(chromedp.PDFPaper(paper)))
		require.NoError(t, err)
		assert.True(t, strings.HasPrefix(string(pdf), "%PDF-"), "paper %v", paper)
	}
	errs, _ := pl.snapshot()
	assert.Empty(t, errs)
}

func TestBrowserLiveViewUpdates(t *testing.T) {
	ctx, pl := browser(t)
	dir := t.TempDir()
	path := filepath.Join(dir, "box.yaml")
	require.NoError(t, os.WriteFile(path, []byte(model("first draft")), 0o644))
	s := NewServer(path)
	ts := httptest.NewServer(s.Handler())
	defer ts.Close()
	defer s.Close()
	wctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	started := make(chan struct{})
	go func() { _ = s.Watch(wctx, started) }()
	<-started

	require.NoError(t, chromedp.Do(ctx, chromedp.Navigate(ts.URL+"/"), chromedp.WaitVisible("#diagram svg")))
	// Wait until the page's event stream is connected.
	for {
		s.mu.Lock()
		n := len(s.subs)
		s.mu.Unlock()
		if n > 0 {
			break
		}
		select {
		case <-ctx.Done():
			t.Fatal("the page never opened its event stream")
		case <-time.After(20 * time.Millisecond):
		}
	}
	require.NoError(t, os.WriteFile(path, []byte(model("second draft")), 0o644))
	// The page reloads itself; ask it for its title until it shows the
	// new one (a reload in progress may fail a query: ask again).
	for {
		h1, err := chromedp.Run(ctx, chromedp.Evaluate[string](`document.querySelector("h1") ? document.querySelector("h1").textContent : ""`))
		if err == nil && h1 == "second draft" {
			break
		}
		select {
		case <-ctx.Done():
			t.Fatalf("the page never showed the new title (last %q, %v)", h1, err)
		case <-time.After(50 * time.Millisecond):
		}
	}
	require.NoError(t, chromedp.Do(ctx, chromedp.WaitVisible("#results")))
	tableRows, err := chromedp.Run(ctx, chromedp.Evaluate[int](`document.querySelectorAll("#results tbody tr").length`))
	require.NoError(t, err)
	assert.Equal(t, 2, tableRows, "ambient and chip")
	for sel, wh := range boxes(t, ctx, "#diagram svg", "#results") {
		assert.Greater(t, wh[0]*wh[1], 0.0, sel)
	}

	errs, reqs := pl.snapshot()
	assert.Empty(t, errs, "console errors")
	for _, r := range reqs {
		assert.True(t, strings.HasPrefix(r, ts.URL+"/"), "request %s goes only to the live view's server", r)
	}
}
