// Package watchcmd implements "heatgraph watch": the review report served
// on this machine, refreshed in the open browser page whenever the model
// file is saved.
package watchcmd

import (
	"context"
	"errors"
	"fmt"
	"net"
	"net/http"
	"os"
	"os/signal"
	"path/filepath"
	"sync"
	"syscall"
	"time"

	"github.com/fsnotify/fsnotify"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/reportcmd"
	"github.com/spf13/cobra"
)

// DefaultListen is where the live view listens unless told otherwise: this
// machine only.
const DefaultListen = "127.0.0.1:8642"

// Options are the inputs of the watch command.
type Options struct {
	IO     *iostreams.IOStreams
	Model  string
	Listen string // host:port
	// Ctx, when set, stops the server when done (tests); otherwise
	// Ctrl-C or SIGTERM does.
	Ctx context.Context
	// Ready, when set, receives the address the server listens on.
	Ready func(addr string)
}

// NewCmd returns the watch command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "watch MODEL",
		Short: "Serve the review report and refresh it whenever the model is saved",
		Long: `Serve the HTML review report of a model (as "heatgraph report" writes it)
at http://127.0.0.1:8642/ and refresh the open page whenever the model file
is saved. A model with errors shows them on the page, each with its
file:line. The server serves the report and its event stream and nothing
else; it listens on this machine only unless --listen says otherwise.
Ctrl-C stops it.`,
		Example: "  heatgraph watch examples/outdoor-controller.yaml\n  heatgraph watch box.yaml --listen 127.0.0.1:9000",
		Args:    cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Model = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().StringVar(&o.Listen, "listen", DefaultListen, "address to listen on, host:port (another host than 127.0.0.1 exposes the report to the network)")
	return cmd
}

// Server holds the current report page and tells open pages when it
// changes.
type Server struct {
	model string
	live  bool

	mu      sync.Mutex
	page    []byte
	version int
	subs    map[chan int]struct{}
	done    chan struct{}
	closed  bool
}

// NewServer builds the first page of model.
func NewServer(model string) *Server {
	s := &Server{model: model, live: true, subs: map[chan int]struct{}{}, done: make(chan struct{})}
	s.Reload()
	return s
}

// Reload rebuilds the page from the model file and tells every open page.
func (s *Server) Reload() {
	page, _, err := reportcmd.Build(s.model, 0, s.live)
	if err != nil {
		var ee *exit.Error
		if errors.As(err, &ee) && ee.Err != nil {
			err = ee.Err
		}
		page = reportcmd.ErrorPage(s.model, err, s.live)
	}
	s.mu.Lock()
	s.page = page
	s.version++
	v := s.version
	for c := range s.subs {
		select {
		case c <- v:
		default: // a slow page gets the latest change later
		}
	}
	s.mu.Unlock()
}

// Close ends every event stream.
func (s *Server) Close() {
	s.mu.Lock()
	defer s.mu.Unlock()
	if !s.closed {
		s.closed = true
		close(s.done)
	}
}

// Handler serves the page at / and its event stream at /events; nothing
// else.
func (s *Server) Handler() http.Handler {
	mux := http.NewServeMux()
	mux.HandleFunc("GET /{$}", func(w http.ResponseWriter, r *http.Request) {
		s.mu.Lock()
		page := s.page
		s.mu.Unlock()
		h := w.Header()
		h.Set("Content-Type", "text/html; charset=utf-8")
		h.Set("Cache-Control", "no-store")
		h.Set("X-Content-Type-Options", "nosniff")
		_, _ = w.Write(page)
	})
	mux.HandleFunc("GET /events", s.events)
	return mux
}

// events is a server-sent event stream: one "data:" message each time the
// page changes.
func (s *Server) events(w http.ResponseWriter, r *http.Request) {
	flusher, ok := w.(http.Flusher)
	if !ok {
		http.Error(w, "streaming unsupported", http.StatusInternalServerError)
		return
	}
	c := make(chan int, 1)
	s.mu.Lock()
	s.subs[c] = struct{}{}
	s.mu.Unlock()
	defer func() {
		s.mu.Lock()
		delete(s.subs, c)
		s.mu.Unlock()
	}()
	h := w.Header()
	h.Set("Content-Type", "text/event-stream")
	h.Set("Cache-Control", "no-store")
	// A comment, not a message: the page reloads on messages only.
	fmt.Fprint(w, ": connected\n\n")
	flusher.Flush()
	for {
		select {
		case v := <-c:
			fmt.Fprintf(w, "id: %d\ndata: changed\n\n", v)
			flusher.Flush()
		case <-r.Context().Done():
			return
		case <-s.done:
			return
		}
	}
}

// Watch reloads the page whenever the model file is written, created or
// renamed into place (editors often save by renaming), until ctx is done.
// It watches the model's folder, so a file replaced by another is followed.
func (s *Server) Watch(ctx context.Context, started chan<- struct{}) error {
	w, err := fsnotify.NewWatcher()
	if err != nil {
		return err
	}
	defer w.Close()
	dir := filepath.Dir(s.model)
	if err := w.Add(dir); err != nil {
		return err
	}
	if started != nil {
		close(started)
	}
	target, _ := filepath.Abs(s.model)
	var timer *time.Timer
	fire := make(chan struct{}, 1)
	for {
		select {
		case <-ctx.Done():
			return nil
		case ev, ok := <-w.Events:
			if !ok {
				return nil
			}
			name, _ := filepath.Abs(ev.Name)
			if name != target || !ev.Has(fsnotify.Write|fsnotify.Create|fsnotify.Rename) {
				continue
			}
			// An editor's save is several events: wait for them to settle.
			if timer != nil {
				timer.Stop()
			}
			timer = time.AfterFunc(150*time.Millisecond, func() {
				select {
				case fire <- struct{}{}:
				default:
				}
			})
		case <-fire:
			s.Reload()
		case err, ok := <-w.Errors:
			if !ok {
				return nil
			}
			return err
		}
	}
}

// Run serves the live view until Ctrl-C.
func Run(o *Options) error {
	if _, err := os.Stat(o.Model); err != nil {
		return exit.With(exit.BadInput, "%v", err)
	}
	listen := o.Listen
	if listen == "" {
		listen = DefaultListen
	}
	ln, err := net.Listen("tcp", listen)
	if err != nil {
		return exit.With(exit.BadInput, "cannot listen on %s: %v", listen, err)
	}
	ctx := o.Ctx
	if ctx == nil {
		ctx = context.Background()
	}
	ctx, stop := signal.NotifyContext(ctx, os.Interrupt, syscall.SIGTERM)
	defer stop()

	s := NewServer(o.Model)
	srv := &http.Server{Handler: s.Handler(), ReadHeaderTimeout: 10 * time.Second}
	watchErr := make(chan error, 1)
	go func() { watchErr <- s.Watch(ctx, nil) }()
	served := make(chan error, 1)
	go func() { served <- srv.Serve(ln) }()
	addr := ln.Addr().String()
	fmt.Fprintf(o.IO.ErrOut, "serving the report of %s at http://%s/ ; it refreshes when the file is saved; Ctrl-C stops\n", o.Model, addr)
	if o.Ready != nil {
		o.Ready(addr)
	}
	var runErr error
	select {
	case <-ctx.Done():
	case err := <-watchErr:
		if err != nil {
			runErr = exit.With(exit.OutputFailed, "watching %s: %v", o.Model, err)
		}
	case err := <-served:
		runErr = exit.With(exit.OutputFailed, "serving: %v", err)
	}
	s.Close()
	shutdown, cancel := context.WithTimeout(context.Background(), 5*time.Second)
	defer cancel()
	if err := srv.Shutdown(shutdown); err != nil && runErr == nil {
		runErr = exit.With(exit.OutputFailed, "stopping the server: %v", err)
	}
	fmt.Fprintln(o.IO.ErrOut, "stopped")
	return runErr
}
