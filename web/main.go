// Command web builds the Fieldfit browser bundle and serves it locally, or
// writes it to a folder for a static host.
//
//	go run ./web               build, then serve on http://127.0.0.1:8080/
//	go run ./web -addr :9000   serve on another address
//	go run ./web -out dist     write the bundle (with .gz files) to dist
//
// The default port stays fixed on purpose: IndexedDB (the stored projects)
// and the service worker (offline use) belong to the origin, so a page
// served from another port starts with no projects.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"net"
	"net/http"
	"os"
	"os/signal"
	"time"

	"fieldfit/web/bundle"
)

func main() {
	addr := flag.String("addr", "127.0.0.1:8080", "address to serve on")
	out := flag.String("out", "", "write the static bundle to this folder instead of serving it")
	pkg := flag.String("pkg", "./wasm", "the WebAssembly main package, relative to the module root")
	flag.Parse()
	if err := run(*addr, *out, *pkg, extraFiles); err != nil {
		fmt.Fprintln(os.Stderr, "web:", err)
		os.Exit(1)
	}
}

// extraFiles are the files of other packages that the page needs, relative
// to the module root: the style sheet of the screens.
var extraFiles = []string{"ui/screens.css", "ui/report.css"}

func run(addr, out, pkg string, extra []string) error {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	start := time.Now()
	b, err := bundle.Build(ctx, bundle.Options{Package: pkg, Extra: extra, Log: os.Stderr})
	if err != nil {
		return err
	}
	raw, gz := b.Size()
	fmt.Fprintf(os.Stderr, "web: bundle %s ready in %.1f s: %d files, %.2f MB (%.2f MB gzipped)\n",
		b.Version, time.Since(start).Seconds(), len(b.Files), float64(raw)/1e6, float64(gz)/1e6)

	if out != "" {
		if err := b.WriteDir(out); err != nil {
			return err
		}
		fmt.Printf("Fieldfit %s written to %s\n", b.Version, out)
		return nil
	}

	ln, err := net.Listen("tcp", addr)
	if err != nil {
		return err
	}
	url := "http://" + displayAddr(ln.Addr().(*net.TCPAddr)) + "/"
	fmt.Printf("Fieldfit %s: %s\n", b.Version, url)
	if ip := ln.Addr().(*net.TCPAddr).IP; !ip.IsLoopback() {
		fmt.Fprintln(os.Stderr, "web: note: over plain http, browsers allow offline use (the service worker) only on localhost; other devices need https")
	}
	srv := &http.Server{Handler: b.Handler(), ReadHeaderTimeout: 10 * time.Second}
	go func() {
		<-ctx.Done()
		shut, cancel := context.WithTimeout(context.Background(), 5*time.Second)
		defer cancel()
		srv.Shutdown(shut)
	}()
	if err := srv.Serve(ln); !errors.Is(err, http.ErrServerClosed) {
		return err
	}
	return nil
}

// displayAddr names an address the way a browser can open it.
func displayAddr(a *net.TCPAddr) string {
	if a.IP.IsUnspecified() {
		return fmt.Sprintf("localhost:%d", a.Port)
	}
	return a.String()
}
