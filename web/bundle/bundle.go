// Package bundle builds the files that a browser loads to run Fieldfit —
// the WebAssembly program, Go's wasm_exec.js, the page shell of package
// static and the icons — names the release by a content hash, and serves
// the set over HTTP or writes it to a folder for a static host.
//
// Build compiles the program (GOOS=js GOARCH=wasm) and calls Assemble;
// Assemble alone puts a bundle together from a program already compiled.
// The version is derived from a SHA-256 hash over every file, so a release
// that changes any byte gets a new version, a new service-worker cache and
// an update notice on devices that have the old one.
package bundle

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"context"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"mime"
	"os"
	"os/exec"
	"path"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"fieldfit/web/static"
)

// Content-Security-Policy of the page. Only the page's own origin may
// provide anything; 'wasm-unsafe-eval' lets the page compile WebAssembly
// (CSP Level 3) and nothing else that eval would allow. Images may also come
// from blob: URLs the page itself made: the PNG export of a plot loads the
// plot's SVG as an <img> from one and draws it on a canvas.
const CSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; " +
	"img-src 'self' blob:; font-src 'self'; connect-src 'self'; worker-src 'self'; manifest-src 'self'; " +
	"object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'"

// MetaCSP is CSP as the page's <meta> tag carries it, for a static host that
// sends no headers. It lacks frame-ancestors, which browsers ignore (with a
// console error) in a <meta> tag.
const MetaCSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; style-src 'self'; " +
	"img-src 'self' blob:; font-src 'self'; connect-src 'self'; worker-src 'self'; manifest-src 'self'; " +
	"object-src 'none'; base-uri 'none'; form-action 'none'"

// Names of files in the bundle.
const (
	WasmFile     = "app.wasm"
	WasmExecFile = "wasm_exec.js"
	IndexFile    = "index.html"
	WorkerFile   = "sw.js"
)

// Placeholders in the shell files (see package static).
const (
	placeCSP     = "__FIELDFIT_CSP__"
	placeFiles   = "__FIELDFIT_FILES__"
	placeVersion = "__FIELDFIT_VERSION__"
	placeStyles  = "__FIELDFIT_STYLES__"
	placePrefix  = "__FIELDFIT_"
)

// Options says what Build compiles. The zero value builds ./wasm of the
// module that contains the current directory.
type Options struct {
	// Dir is a directory inside the module; the module root is found from
	// it with "go env GOMOD". If Dir is "", the current directory is used.
	Dir string
	// Package is the main package to compile, relative to the module root.
	// If Package is "", it is defaulted to "./wasm".
	Package string
	// Go is the go command. If Go is "", "go" is looked up in PATH.
	Go string
	// Static holds the shell files. If Static is nil, it is defaulted to
	// static.FS.
	Static fs.FS
	// Extra names more files to add to the bundle under their base names,
	// as paths relative to the module root, such as "ui/screens.css". A
	// style sheet among them is linked from index.html. If Extra is nil,
	// nothing is added.
	Extra []string
	// Log receives one line per step. If Log is nil, nothing is written.
	Log io.Writer
}

// File is one file of a bundle.
type File struct {
	Name string // slash-separated path in the bundle, such as "index.html"
	Type string // Content-Type
	Data []byte
	Gzip []byte // Data compressed with gzip (default level: within 1 % of the best, 3 times faster)
	ETag string // strong entity tag of Data; the gzip form appends "-gz"
}

// Bundle is one release of the browser files.
type Bundle struct {
	// Files holds every file, sorted by Name.
	Files []File
	// Hash is the hex SHA-256 over every file (name, length and content, in
	// name order), taken before the version is written into the files.
	Hash string
	// Version is the first 12 hex digits of Hash.
	Version string
	// Compile is how long the WebAssembly compile took (zero for
	// Assemble).
	Compile time.Duration
}

// File returns the file with this name.
func (b *Bundle) File(name string) (File, bool) {
	i, ok := slices.BinarySearchFunc(b.Files, name, func(f File, n string) int { return strings.Compare(f.Name, n) })
	if !ok {
		return File{}, false
	}
	return b.Files[i], true
}

// Size returns the total size of the files, as they are and gzipped.
func (b *Bundle) Size() (raw, gz int64) {
	for _, f := range b.Files {
		raw += int64(len(f.Data))
		gz += int64(min(len(f.Gzip), len(f.Data)))
	}
	return raw, gz
}

// Build compiles the WebAssembly program, copies wasm_exec.js from the same
// Go toolchain, and assembles the bundle.
func Build(ctx context.Context, opts Options) (*Bundle, error) {
	goCmd := opts.Go
	if goCmd == "" {
		p, err := exec.LookPath("go")
		if err != nil {
			return nil, fmt.Errorf("bundle: the go command is not in PATH: %w", err)
		}
		goCmd = p
	}
	pkg := opts.Package
	if pkg == "" {
		pkg = "./wasm"
	}
	dir := opts.Dir
	if dir == "" {
		var err error
		if dir, err = os.Getwd(); err != nil {
			return nil, fmt.Errorf("bundle: %w", err)
		}
	}
	logf := func(format string, args ...any) {
		if opts.Log != nil {
			fmt.Fprintf(opts.Log, format+"\n", args...)
		}
	}

	env := append(os.Environ(), "GOOS=js", "GOARCH=wasm", "CGO_ENABLED=0")
	root, goroot, err := goEnv(ctx, goCmd, dir, env)
	if err != nil {
		return nil, err
	}
	if st, err := os.Stat(filepath.Join(root, filepath.FromSlash(pkg))); err != nil || !st.IsDir() {
		return nil, fmt.Errorf("bundle: no package %s in the module at %s (the WebAssembly main package is missing)", pkg, root)
	}
	wasmExec, err := readWasmExec(goroot)
	if err != nil {
		return nil, err
	}
	extra, err := readExtra(root, opts.Extra)
	if err != nil {
		return nil, err
	}

	tmp, err := os.MkdirTemp("", "fieldfit-wasm-")
	if err != nil {
		return nil, fmt.Errorf("bundle: %w", err)
	}
	defer os.RemoveAll(tmp)
	out := filepath.Join(tmp, WasmFile)
	args := append([]string{"build", "-trimpath", "-ldflags=-s"}, inlineFlags...)
	args = append(args, "-o", out, pkg)
	cmd := exec.CommandContext(ctx, goCmd, args...)
	cmd.Dir = root
	cmd.Env = env
	var stderr bytes.Buffer
	cmd.Stdout = &stderr
	cmd.Stderr = &stderr
	logf("bundle: GOOS=js GOARCH=wasm go %s (in %s)", strings.Join(args, " "), root)
	start := time.Now()
	if err := cmd.Run(); err != nil {
		return nil, fmt.Errorf("bundle: compiling %s for js/wasm failed: %w\n%s", pkg, err, strings.TrimSpace(stderr.String()))
	}
	took := time.Since(start)
	wasm, err := os.ReadFile(out)
	if err != nil {
		return nil, fmt.Errorf("bundle: %w", err)
	}
	logf("bundle: compiled %s in %.1f s (%d bytes)", WasmFile, took.Seconds(), len(wasm))

	st := opts.Static
	if st == nil {
		st = static.FS
	}
	b, err := assemble(wasm, wasmExec, st, extra)
	if err != nil {
		return nil, err
	}
	b.Compile = took
	raw, gz := b.Size()
	logf("bundle: version %s, %d files, %d bytes (%d gzipped)", b.Version, len(b.Files), raw, gz)
	return b, nil
}

// goEnv returns the module root (the folder of go.mod) and GOROOT of the
// toolchain that goCmd runs in dir.
func goEnv(ctx context.Context, goCmd, dir string, env []string) (root, goroot string, err error) {
	cmd := exec.CommandContext(ctx, goCmd, "env", "GOMOD", "GOROOT")
	cmd.Dir = dir
	cmd.Env = env
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	outb, err := cmd.Output()
	if err != nil {
		return "", "", fmt.Errorf("bundle: go env in %s: %w\n%s", dir, err, strings.TrimSpace(stderr.String()))
	}
	var lines []string
	sc := bufio.NewScanner(bytes.NewReader(outb))
	for sc.Scan() {
		lines = append(lines, strings.TrimSpace(sc.Text()))
	}
	if len(lines) != 2 {
		return "", "", fmt.Errorf("bundle: go env GOMOD GOROOT printed %q", outb)
	}
	gomod, goroot := lines[0], lines[1]
	if gomod == "" || gomod == os.DevNull {
		return "", "", fmt.Errorf("bundle: %s is not inside a Go module (go env GOMOD is empty); run this from the Fieldfit repository", dir)
	}
	return filepath.Dir(gomod), goroot, nil
}

// readWasmExec reads wasm_exec.js of the toolchain at goroot (lib/wasm
// since Go 1.24, misc/wasm before).
func readWasmExec(goroot string) ([]byte, error) {
	var errs []error
	for _, p := range []string{"lib/wasm/wasm_exec.js", "misc/wasm/wasm_exec.js"} {
		b, err := os.ReadFile(filepath.Join(goroot, filepath.FromSlash(p)))
		if err == nil {
			return b, nil
		}
		errs = append(errs, err)
	}
	return nil, fmt.Errorf("bundle: wasm_exec.js not found in GOROOT %s: %w", goroot, errors.Join(errs...))
}

// readExtra reads the files extra (relative to root) by base name.
func readExtra(root string, extra []string) (map[string][]byte, error) {
	m := make(map[string][]byte, len(extra))
	for _, e := range extra {
		data, err := os.ReadFile(filepath.Join(root, filepath.FromSlash(e)))
		if err != nil {
			return nil, fmt.Errorf("bundle: extra file: %w", err)
		}
		name := path.Base(filepath.ToSlash(e))
		if _, dup := m[name]; dup {
			return nil, fmt.Errorf("bundle: two extra files are named %s", name)
		}
		m[name] = data
	}
	return m, nil
}

// requiredStatic are the shell files without which the page cannot work.
var requiredStatic = []string{IndexFile, WorkerFile, "loader.js", "manifest.webmanifest", "app.css"}

// Assemble puts a bundle together from a compiled program (wasm), Go's
// wasm_exec.js and the shell files in st. It adds the icons, fills in the
// placeholders, hashes the files and compresses each with gzip.
func Assemble(wasm, wasmExec []byte, st fs.FS) (*Bundle, error) {
	return assemble(wasm, wasmExec, st, nil)
}

// assemble is Assemble with extra files by name.
func assemble(wasm, wasmExec []byte, st fs.FS, extra map[string][]byte) (*Bundle, error) {
	if !bytes.HasPrefix(wasm, []byte("\x00asm")) {
		return nil, fmt.Errorf("bundle: %s is not a WebAssembly module (it does not start with \\0asm)", WasmFile)
	}
	files := map[string][]byte{
		WasmFile:     wasm,
		WasmExecFile: wasmExec,
	}
	for name, data := range Icons() {
		files[name] = data
	}
	err := fs.WalkDir(st, ".", func(p string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		if d.IsDir() || strings.HasSuffix(p, ".go") {
			return nil
		}
		if _, dup := files[p]; dup {
			return fmt.Errorf("the shell file %s has the name of a generated file", p)
		}
		data, err := fs.ReadFile(st, p)
		if err != nil {
			return err
		}
		files[p] = data
		return nil
	})
	if err != nil {
		return nil, fmt.Errorf("bundle: reading the shell files: %w", err)
	}
	for name, data := range extra {
		if _, dup := files[name]; dup {
			return nil, fmt.Errorf("bundle: the extra file %s has the name of a shell or generated file", name)
		}
		files[name] = data
	}
	for _, name := range requiredStatic {
		if _, ok := files[name]; !ok {
			return nil, fmt.Errorf("bundle: the shell file %s is missing", name)
		}
	}

	names := make([]string, 0, len(files))
	for name := range files {
		names = append(names, name)
	}
	slices.Sort(names)

	// The service worker precaches every file but itself.
	precache := make([]string, 0, len(names))
	for _, n := range names {
		if n != WorkerFile {
			precache = append(precache, n)
		}
	}
	list, err := json.Marshal(precache)
	if err != nil {
		return nil, fmt.Errorf("bundle: %w", err)
	}
	cspValue := strings.ReplaceAll(MetaCSP, `"`, "&quot;")
	var styles []string
	for _, n := range names {
		if path.Ext(n) == ".css" && n != "app.css" {
			styles = append(styles, `<link rel="stylesheet" href="`+n+`">`)
		}
	}

	// Fill in everything but the version, hash, then fill in the version.
	for _, n := range names {
		if isText(n) {
			s := string(files[n])
			s = strings.ReplaceAll(s, placeCSP, cspValue)
			s = strings.ReplaceAll(s, placeFiles, string(list))
			s = strings.ReplaceAll(s, placeStyles, strings.Join(styles, "\n"))
			files[n] = []byte(s)
		}
	}
	h := sha256.New()
	var lenBuf [8]byte
	for _, n := range names {
		io.WriteString(h, n)
		h.Write([]byte{0})
		binary.BigEndian.PutUint64(lenBuf[:], uint64(len(files[n])))
		h.Write(lenBuf[:])
		h.Write(files[n])
	}
	hash := hex.EncodeToString(h.Sum(nil))
	version := hash[:12]

	b := &Bundle{Hash: hash, Version: version}
	for _, n := range names {
		data := files[n]
		if isText(n) {
			data = bytes.ReplaceAll(data, []byte(placeVersion), []byte(version))
			if i := bytes.Index(data, []byte(placePrefix)); i >= 0 && n != WasmExecFile {
				end := min(i+40, len(data))
				return nil, fmt.Errorf("bundle: %s has an unknown placeholder at byte %d: %q", n, i, data[i:end])
			}
		}
		gz, err := gzipBytes(data)
		if err != nil {
			return nil, fmt.Errorf("bundle: compressing %s: %w", n, err)
		}
		sum := sha256.Sum256(data)
		b.Files = append(b.Files, File{
			Name: n,
			Type: contentType(n),
			Data: data,
			Gzip: gz,
			ETag: `"` + hex.EncodeToString(sum[:8]) + `"`,
		})
	}
	return b, nil
}

func isText(name string) bool {
	switch path.Ext(name) {
	case ".html", ".js", ".css", ".webmanifest", ".json", ".svg", ".txt":
		return true
	}
	return false
}

// contentType returns the Content-Type for a file name; the list is fixed
// here so that the result does not depend on the system's MIME tables.
func contentType(name string) string {
	switch path.Ext(name) {
	case ".html":
		return "text/html; charset=utf-8"
	case ".js":
		return "text/javascript; charset=utf-8"
	case ".css":
		return "text/css; charset=utf-8"
	case ".wasm":
		return "application/wasm"
	case ".webmanifest":
		return "application/manifest+json"
	case ".json":
		return "application/json"
	case ".svg":
		return "image/svg+xml"
	case ".png":
		return "image/png"
	case ".txt":
		return "text/plain; charset=utf-8"
	}
	if t := mime.TypeByExtension(path.Ext(name)); t != "" {
		return t
	}
	return "application/octet-stream"
}

// inlineFlags turn inlining off for every package except the numerical
// ones (the solver, the models, gonum, math and the runtime), where calls in
// inner loops matter. Inlining copies small functions into every caller: in
// the screens it made app.wasm about 0.1 MB larger gzipped (measured
// 2026-12-01: 1.85 MB with inlining everywhere, 1.79 MB with these flags;
// the budget is 1.8 MB) for no speed a person notices. On the command line
// the last matching pattern wins.
var inlineFlags = []string{
	"-gcflags=all=-l",
	"-gcflags=fieldfit/fitcore/...=",
	"-gcflags=fieldfit/models/...=",
	"-gcflags=gonum.org/v1/gonum/...=",
	"-gcflags=runtime=",
	"-gcflags=math=",
	// The slug, infiltration and decay interpretations fit a few dozen
	// readings once per edit: inlining there bought no speed a person
	// notices and cost 6.8 kB gzipped (measured 2026-12-02).
	"-gcflags=fieldfit/models/slug=-l",
	"-gcflags=fieldfit/models/infiltration=-l",
	"-gcflags=fieldfit/models/decay=-l",
}

// gzipBytes compresses data once, at build time, for every download. The
// best compression costs about a second more on app.wasm than the default
// and saves about 1.7 % of what each tablet downloads.
func gzipBytes(data []byte) ([]byte, error) {
	var buf bytes.Buffer
	zw, err := gzip.NewWriterLevel(&buf, gzip.BestCompression)
	if err != nil {
		return nil, err
	}
	if _, err := zw.Write(data); err != nil {
		return nil, err
	}
	if err := zw.Close(); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// WriteDir writes every file of the bundle into dir, each with its gzip
// form beside it (name.gz), for a static host. dir is created if needed;
// files of the same names are replaced, other files are left alone.
func (b *Bundle) WriteDir(dir string) error {
	for _, f := range b.Files {
		p := filepath.Join(dir, filepath.FromSlash(f.Name))
		if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
			return fmt.Errorf("bundle: %w", err)
		}
		if err := os.WriteFile(p, f.Data, 0o644); err != nil {
			return fmt.Errorf("bundle: %w", err)
		}
		if err := os.WriteFile(p+".gz", f.Gzip, 0o644); err != nil {
			return fmt.Errorf("bundle: %w", err)
		}
	}
	return nil
}
