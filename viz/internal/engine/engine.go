// Package engine lays out graphs in the DOT language with Graphviz, compiled
// to WebAssembly and run in-process by the wazero runtime, so that no system
// Graphviz is needed.
//
// Nothing happens when the package is imported: the WebAssembly module is
// compiled on the first Render, in the one process that draws. Compiled
// code is cached in a folder of the program's own (Cache), checked to
// belong to the user and to be closed to others; when no such folder can be
// had, the module is compiled in memory instead. Every failure is returned
// as an error, never as a panic.
//
// graphviz.wasm is Graphviz 12.1.2 (Eclipse Public License 1.0) built for
// wasm32-wasi with the C bridge of github.com/goccy/go-graphviz v0.2.10
// (MIT licence); see NOTICE. This package calls the bridge's exported
// functions directly, without that module's Go package, whose package
// initialisation compiles the module in every program that imports it.
package engine

import (
	"context"
	_ "embed"
	"errors"
	"fmt"
	"sync"

	"github.com/tetratelabs/wazero"
	"github.com/tetratelabs/wazero/api"
	"github.com/tetratelabs/wazero/imports/wasi_snapshot_preview1"
)

//go:embed graphviz.wasm
var wasmFile []byte

// Formats Render can produce (Graphviz output format names).
const (
	SVG  = "svg"
	XDOT = "xdot" // DOT with drawing operations, for painting
	DOT  = "dot"  // DOT with layout positions
)

// ErrLayoutTimeout is returned (wrapped) when the context ends before the
// layout is done.
var ErrLayoutTimeout = errors.New("the layout took too long")

// engineRuntime is the compiled module, shared by every Render of the process.
type engineRuntime struct {
	rt       wazero.Runtime
	compiled wazero.CompiledModule
	cacheDir string // where compiled code is cached, "" for memory only
}

var (
	startOnce sync.Once
	started   *engineRuntime
	startErr  error
)

// start compiles the module once per process.
func start() (*engineRuntime, error) {
	startOnce.Do(func() {
		ctx := context.Background()
		dir, cache := Cache()
		r, err := compile(ctx, cache)
		if err != nil && cache != nil {
			// A cache that cannot be read or written is not worth
			// failing for: compile in memory.
			dir = ""
			r, err = compile(ctx, nil)
		}
		if err != nil {
			startErr = fmt.Errorf("starting the layout engine: %w", err)
			return
		}
		r.cacheDir = dir
		started = r
	})
	return started, startErr
}

func compile(ctx context.Context, cache wazero.CompilationCache) (r *engineRuntime, err error) {
	defer func() {
		if p := recover(); p != nil {
			err = fmt.Errorf("%v", p)
		}
	}()
	cfg := wazero.NewRuntimeConfig().WithCloseOnContextDone(true)
	if cache != nil {
		cfg = cfg.WithCompilationCache(cache)
	}
	rt := wazero.NewRuntimeWithConfig(ctx, cfg)
	fail := func(err error) (*engineRuntime, error) {
		rt.Close(ctx)
		return nil, err
	}
	if _, err := wasi_snapshot_preview1.Instantiate(ctx, rt); err != nil {
		return fail(err)
	}
	compiled, err := rt.CompileModule(ctx, wasmFile)
	if err != nil {
		return fail(err)
	}
	// The bridge imports callbacks into Go for plugins written in Go
	// (renderers, id allocators, file access). heatgraph uses none of
	// them: each import gets a stub that stops the layout with an error
	// should Graphviz ever call it.
	env := rt.NewHostModuleBuilder("env")
	for _, f := range compiled.ImportedFunctions() {
		module, name, _ := f.Import()
		if module != "env" {
			continue
		}
		env.NewFunctionBuilder().WithGoModuleFunction(
			api.GoModuleFunc(func(context.Context, api.Module, []uint64) {
				panic(fmt.Errorf("the layout engine called the unsupported callback %s", name))
			}),
			f.ParamTypes(), f.ResultTypes(),
		).Export(name)
	}
	if _, err := env.Instantiate(ctx); err != nil {
		return fail(err)
	}
	return &engineRuntime{rt: rt, compiled: compiled}, nil
}

// Render lays out DOT source with the dot layout and returns it in format
// (SVG, XDOT or DOT). It stops with an error wrapping ErrLayoutTimeout
// when ctx ends first.
func Render(ctx context.Context, dot string, format string) (out []byte, err error) {
	r, err := start()
	if err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, fmt.Errorf("%w: %v", ErrLayoutTimeout, err)
	}
	// A fresh instance per drawing: its memory goes when it is closed, and
	// an instance stopped by the context cannot be reused anyway.
	mod, err := r.rt.InstantiateModule(ctx, r.compiled, wazero.NewModuleConfig().WithName(""))
	if err != nil {
		return nil, fmt.Errorf("starting the layout engine: %w", err)
	}
	defer mod.Close(context.Background())
	defer func() {
		if p := recover(); p != nil {
			err = fmt.Errorf("layout engine: %v", p)
		}
		if err != nil && ctx.Err() != nil {
			err = fmt.Errorf("%w: %v", ErrLayoutTimeout, ctx.Err())
		}
	}()
	b := &bridge{ctx: ctx, mod: mod}
	return b.render(dot, format)
}

// bridge calls the exported functions of the C bridge. Its conventions:
// every function is named "wasm_bridge_<name>" and returns its result
// through a pointer passed as the last argument; strings go in as
// NUL-terminated bytes and come out as {char *p; int n}; slices are
// {int len; void *data} with 8-byte elements.
type bridge struct {
	ctx context.Context
	mod api.Module
}

func (b *bridge) render(dot, format string) ([]byte, error) {
	if _, err := b.callRet("setError", 2); err != nil { // AGMAX: keep Graphviz quiet
		return nil, err
	}
	plugins, err := b.callRet("SymList_default")
	if err != nil {
		return nil, err
	}
	gvc, err := b.callRet("getContextWithPlugins", plugins, 1)
	if err != nil {
		return nil, err
	}
	if gvc == 0 {
		return nil, errors.New("the layout engine could not start its context")
	}
	src, err := b.cString(dot)
	if err != nil {
		return nil, err
	}
	graph, err := b.callRet("memRead", src)
	if err != nil {
		return nil, err
	}
	if graph == 0 {
		return nil, fmt.Errorf("reading the diagram: %s", b.lastError())
	}
	engine, err := b.cString("dot")
	if err != nil {
		return nil, err
	}
	if rc, err := b.callRet("Context_layout", gvc, graph, engine); err != nil {
		return nil, err
	} else if int32(rc) != 0 {
		return nil, fmt.Errorf("laying out the diagram: %s", b.lastError())
	}
	fmtPtr, err := b.cString(format)
	if err != nil {
		return nil, err
	}
	textSlot, err := b.malloc(4)
	if err != nil {
		return nil, err
	}
	lenSlot, err := b.malloc(4)
	if err != nil {
		return nil, err
	}
	if rc, err := b.callRet("Context_renderData", gvc, graph, fmtPtr, textSlot, lenSlot); err != nil {
		return nil, err
	} else if int32(rc) != 0 {
		return nil, fmt.Errorf("drawing the diagram as %s: %s", format, b.lastError())
	}
	str, err := b.u32(textSlot)
	if err != nil {
		return nil, err
	}
	out, err := b.goString(str)
	if err != nil {
		return nil, err
	}
	// The instance is closed next, which frees everything at once.
	return out, nil
}

func (b *bridge) fn(name string) (api.Function, error) {
	f := b.mod.ExportedFunction("wasm_bridge_" + name)
	if f == nil {
		return nil, fmt.Errorf("the layout engine has no function %s", name)
	}
	return f, nil
}

// callRet calls a bridge function with args and a result slot, and returns
// the 32-bit value written into the slot.
func (b *bridge) callRet(name string, args ...uint64) (uint64, error) {
	f, err := b.fn(name)
	if err != nil {
		return 0, err
	}
	slot, err := b.malloc(4)
	if err != nil {
		return 0, err
	}
	if !b.mod.Memory().WriteUint32Le(uint32(slot), 0) {
		return 0, errors.New("layout engine memory out of range")
	}
	if _, err := f.Call(b.ctx, append(args, slot)...); err != nil {
		return 0, fmt.Errorf("layout engine (%s): %w", name, err)
	}
	return b.u32(slot)
}

func (b *bridge) malloc(n uint64) (uint64, error) {
	f := b.mod.ExportedFunction("malloc")
	if f == nil {
		return 0, errors.New("the layout engine has no malloc")
	}
	res, err := f.Call(b.ctx, n)
	if err != nil {
		return 0, fmt.Errorf("layout engine (malloc): %w", err)
	}
	if res[0] == 0 {
		return 0, errors.New("the layout engine ran out of memory")
	}
	return res[0], nil
}

func (b *bridge) u32(p uint64) (uint64, error) {
	v, ok := b.mod.Memory().ReadUint32Le(uint32(p))
	if !ok {
		return 0, errors.New("layout engine memory out of range")
	}
	return uint64(v), nil
}

// cString copies s into the module's memory, NUL-terminated.
func (b *bridge) cString(s string) (uint64, error) {
	p, err := b.malloc(uint64(len(s)) + 1)
	if err != nil {
		return 0, err
	}
	if !b.mod.Memory().Write(uint32(p), append([]byte(s), 0)) {
		return 0, errors.New("layout engine memory out of range")
	}
	return p, nil
}

// goString reads a bridge string {char *p; int n}.
func (b *bridge) goString(p uint64) ([]byte, error) {
	if p == 0 {
		return nil, nil
	}
	data, err := b.u32(p)
	if err != nil {
		return nil, err
	}
	n, err := b.u32(p + 4)
	if err != nil {
		return nil, err
	}
	bytes, ok := b.mod.Memory().Read(uint32(data), uint32(n))
	if !ok {
		return nil, errors.New("layout engine memory out of range")
	}
	return append([]byte(nil), bytes...), nil
}

// lastError returns Graphviz's last error message.
func (b *bridge) lastError() string {
	p, err := b.callRet("lastError")
	if err != nil {
		return err.Error()
	}
	s, err := b.goString(p)
	if err != nil || len(s) == 0 {
		return "unknown error"
	}
	return string(s)
}
