package bundle_test

import (
	"bytes"
	"compress/gzip"
	"context"
	"encoding/json"
	"encoding/xml"
	"image/png"
	"io"
	"io/fs"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"regexp"
	"runtime"
	"slices"
	"strings"
	"sync"
	"testing"
	"testing/fstest"

	"fieldfit/web/bundle"
	"fieldfit/web/static"
)

// fakeWasm is the smallest valid WebAssembly module: magic and version 1
// (WebAssembly Core Specification, 5.5.16 "Modules").
var fakeWasm = []byte("\x00asm\x01\x00\x00\x00")

var fakeExec = []byte("// wasm_exec.js stand-in\n")

func assemble(t *testing.T, st fs.FS) *bundle.Bundle {
	t.Helper()
	b, err := bundle.Assemble(fakeWasm, fakeExec, st)
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// copyStatic returns the shell files as a MapFS that a test can change.
func copyStatic(t *testing.T) fstest.MapFS {
	t.Helper()
	m := fstest.MapFS{}
	err := fs.WalkDir(static.FS, ".", func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() {
			return err
		}
		data, err := fs.ReadFile(static.FS, p)
		m[p] = &fstest.MapFile{Data: data}
		return err
	})
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func TestAssembleFiles(t *testing.T) {
	b := assemble(t, static.FS)
	var names []string
	for _, f := range b.Files {
		names = append(names, f.Name)
	}
	want := []string{"app.css", "app.wasm", "apple-touch-icon.png", "icon-192.png", "icon-512.png", "icon.svg",
		"index.html", "loader.js", "manifest.webmanifest", "sw.js", "wasm_exec.js"}
	if !slices.Equal(names, want) {
		t.Fatalf("files %v, want %v", names, want)
	}
	if !regexp.MustCompile(`^[0-9a-f]{64}$`).MatchString(b.Hash) || b.Version != b.Hash[:12] {
		t.Errorf("hash %q, version %q", b.Hash, b.Version)
	}
	for _, f := range b.Files {
		if bytes.Contains(f.Data, []byte("__FIELDFIT_")) {
			t.Errorf("%s still has a placeholder", f.Name)
		}
		zr, err := gzip.NewReader(bytes.NewReader(f.Gzip))
		if err != nil {
			t.Fatalf("%s: %v", f.Name, err)
		}
		plain, err := io.ReadAll(zr)
		if err != nil || !bytes.Equal(plain, f.Data) {
			t.Errorf("%s: gzip form does not decompress to the file (%v)", f.Name, err)
		}
	}

	index, _ := b.File("index.html")
	for _, s := range []string{
		`<meta http-equiv="Content-Security-Policy" content="` + bundle.MetaCSP + `">`,
		`<meta name="fieldfit-version" content="` + b.Version + `">`,
		`<span id="app-version">` + b.Version + `</span>`,
		`<script src="loader.js" defer></script>`,
	} {
		if !strings.Contains(string(index.Data), s) {
			t.Errorf("index.html lacks %s", s)
		}
	}
	// No inline script: every <script> has a src and no body.
	for _, m := range regexp.MustCompile(`(?s)<script([^>]*)>(.*?)</script>`).FindAllStringSubmatch(string(index.Data), -1) {
		if !strings.Contains(m[1], "src=") || strings.TrimSpace(m[2]) != "" {
			t.Errorf("inline script in index.html: %q", m[0])
		}
	}

	sw, _ := b.File("sw.js")
	m := regexp.MustCompile(`const FILES = (\[.*\]);`).FindSubmatch(sw.Data)
	if m == nil {
		t.Fatalf("sw.js has no file list")
	}
	var list []string
	if err := json.Unmarshal(m[1], &list); err != nil {
		t.Fatal(err)
	}
	wantList := slices.DeleteFunc(slices.Clone(want), func(s string) bool { return s == "sw.js" })
	if !slices.Equal(list, wantList) {
		t.Errorf("sw.js precaches %v, want %v", list, wantList)
	}
	if !bytes.Contains(sw.Data, []byte(`const VERSION = "`+b.Version+`";`)) {
		t.Errorf("sw.js does not carry version %s", b.Version)
	}
	for _, f := range list {
		if strings.Contains(f, ":") || strings.HasPrefix(f, "/") || strings.HasPrefix(f, "..") {
			t.Errorf("sw.js precaches %q, which is not a plain relative name", f)
		}
	}

	var manifest struct {
		Name  string `json:"name"`
		Icons []struct {
			Src string `json:"src"`
		} `json:"icons"`
	}
	mf, _ := b.File("manifest.webmanifest")
	if err := json.Unmarshal(mf.Data, &manifest); err != nil {
		t.Fatalf("manifest.webmanifest: %v", err)
	}
	if manifest.Name != "Fieldfit" || len(manifest.Icons) == 0 {
		t.Errorf("manifest: %+v", manifest)
	}
	for _, ic := range manifest.Icons {
		if _, ok := b.File(ic.Src); !ok {
			t.Errorf("manifest names icon %s, which is not in the bundle", ic.Src)
		}
	}
}

func TestVersionFollowsContent(t *testing.T) {
	a := assemble(t, static.FS)
	if again := assemble(t, static.FS); again.Hash != a.Hash {
		t.Fatalf("the same input gave hashes %s and %s", a.Hash, again.Hash)
	}
	for _, name := range []string{"app.css", "sw.js", "index.html", "loader.js"} {
		m := copyStatic(t)
		m[name] = &fstest.MapFile{Data: append(slices.Clone(m[name].Data), ' ')}
		if b := assemble(t, m); b.Version == a.Version {
			t.Errorf("changing %s left the version at %s", name, a.Version)
		}
	}
	m := copyStatic(t)
	m["notes.txt"] = &fstest.MapFile{Data: []byte("release notes\n")}
	if b := assemble(t, m); b.Version == a.Version {
		t.Errorf("adding a file left the version at %s", a.Version)
	}
	b, err := bundle.Assemble(append(slices.Clone(fakeWasm), 0), fakeExec, static.FS)
	if err != nil {
		t.Fatal(err)
	}
	if b.Version == a.Version {
		t.Errorf("changing app.wasm left the version at %s", a.Version)
	}
}

func TestStyleSheetsAreLinked(t *testing.T) {
	m := copyStatic(t)
	m["screens.css"] = &fstest.MapFile{Data: []byte("main { margin: 0 }\n")}
	b := assemble(t, m)
	index, _ := b.File("index.html")
	link := `<link rel="stylesheet" href="screens.css">`
	if strings.Count(string(index.Data), link) != 1 || strings.Count(string(index.Data), `href="app.css"`) != 1 {
		t.Errorf("index.html does not link app.css and screens.css once each:\n%s", index.Data)
	}
	plain := assemble(t, static.FS)
	index, _ = plain.File("index.html")
	if strings.Contains(string(index.Data), "screens.css") {
		t.Errorf("index.html links screens.css, which the bundle lacks")
	}
}

func TestAssembleErrors(t *testing.T) {
	if _, err := bundle.Assemble([]byte("not wasm"), fakeExec, static.FS); err == nil || !strings.Contains(err.Error(), "not a WebAssembly module") {
		t.Errorf("non-wasm program: %v", err)
	}
	m := copyStatic(t)
	delete(m, "sw.js")
	if _, err := bundle.Assemble(fakeWasm, fakeExec, m); err == nil || !strings.Contains(err.Error(), "sw.js is missing") {
		t.Errorf("missing sw.js: %v", err)
	}
	m = copyStatic(t)
	m["extra.js"] = &fstest.MapFile{Data: []byte("var x = __FIELDFIT_TYPO__;")}
	if _, err := bundle.Assemble(fakeWasm, fakeExec, m); err == nil || !strings.Contains(err.Error(), "extra.js has an unknown placeholder") {
		t.Errorf("unknown placeholder: %v", err)
	}
	m = copyStatic(t)
	m["icon.svg"] = &fstest.MapFile{Data: []byte("<svg/>")}
	if _, err := bundle.Assemble(fakeWasm, fakeExec, m); err == nil || !strings.Contains(err.Error(), "name of a generated file") {
		t.Errorf("shell file shadowing an icon: %v", err)
	}
}

func TestHandler(t *testing.T) {
	b := assemble(t, static.FS)
	h := b.Handler()
	get := func(method, path string, hdr ...string) *httptest.ResponseRecorder {
		req := httptest.NewRequest(method, path, nil)
		for i := 0; i+1 < len(hdr); i += 2 {
			req.Header.Set(hdr[i], hdr[i+1])
		}
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		return w
	}
	tests := []struct {
		path, accept string
		status       int
		ctype, enc   string
	}{
		{"/", "", 200, "text/html; charset=utf-8", ""},
		{"/index.html", "gzip, deflate, br", 200, "text/html; charset=utf-8", "gzip"},
		{"/app.wasm", "", 200, "application/wasm", ""},
		{"/app.css", "br;q=1, gzip;q=0", 200, "text/css; charset=utf-8", ""},
		{"/sw.js", "*", 200, "text/javascript; charset=utf-8", "gzip"},
		{"/loader.js", "identity", 200, "text/javascript; charset=utf-8", ""},
		{"/manifest.webmanifest", "gzip", 200, "application/manifest+json", "gzip"},
		{"/icon.svg", "gzip", 200, "image/svg+xml", "gzip"},
		{"/icon-512.png", "", 200, "image/png", ""},
		{"/nothing.js", "", 404, "text/plain; charset=utf-8", ""},
		{"/../sw.js", "", 200, "text/javascript; charset=utf-8", ""},
	}
	for _, tt := range tests {
		w := get("GET", tt.path, "Accept-Encoding", tt.accept)
		res := w.Result()
		if res.StatusCode != tt.status || res.Header.Get("Content-Type") != tt.ctype || res.Header.Get("Content-Encoding") != tt.enc {
			t.Errorf("GET %s (Accept-Encoding %q): %d %q %q, want %d %q %q", tt.path, tt.accept,
				res.StatusCode, res.Header.Get("Content-Type"), res.Header.Get("Content-Encoding"), tt.status, tt.ctype, tt.enc)
		}
		if got := res.Header.Get("Content-Security-Policy"); got != bundle.CSP {
			t.Errorf("GET %s: CSP %q", tt.path, got)
		}
		if res.Header.Get("X-Content-Type-Options") != "nosniff" {
			t.Errorf("GET %s: no nosniff", tt.path)
		}
		if tt.status == 200 {
			name := strings.TrimPrefix(tt.path, "/")
			if name == "" {
				name = "index.html"
			}
			name = filepath.Base(name)
			f, _ := b.File(name)
			body := w.Body.Bytes()
			if tt.enc == "gzip" {
				zr, err := gzip.NewReader(bytes.NewReader(body))
				if err != nil {
					t.Fatal(err)
				}
				body, _ = io.ReadAll(zr)
			}
			if !bytes.Equal(body, f.Data) {
				t.Errorf("GET %s: body differs from %s", tt.path, name)
			}
			if res.Header.Get("Cache-Control") != "no-cache" || res.Header.Get("ETag") == "" {
				t.Errorf("GET %s: Cache-Control %q, ETag %q", tt.path, res.Header.Get("Cache-Control"), res.Header.Get("ETag"))
			}
		}
	}

	// A file that gzip does not shrink goes out as it is.
	m := copyStatic(t)
	m["x.txt"] = &fstest.MapFile{Data: []byte("x")}
	req := httptest.NewRequest("GET", "/x.txt", nil)
	req.Header.Set("Accept-Encoding", "gzip")
	w := httptest.NewRecorder()
	assemble(t, m).Handler().ServeHTTP(w, req)
	if w.Code != 200 || w.Header().Get("Content-Encoding") != "" || w.Body.String() != "x" {
		t.Errorf("GET /x.txt: %d %q %q, want 200, no encoding, \"x\"", w.Code, w.Header().Get("Content-Encoding"), w.Body.String())
	}

	// Conditional requests.
	first := get("GET", "/app.css").Result()
	etag := first.Header.Get("ETag")
	if w := get("GET", "/app.css", "If-None-Match", etag); w.Code != 304 || w.Body.Len() != 0 {
		t.Errorf("If-None-Match %s: %d with %d bytes, want 304 and none", etag, w.Code, w.Body.Len())
	}
	if w := get("GET", "/app.css", "If-None-Match", `"other"`); w.Code != 200 {
		t.Errorf("If-None-Match other: %d, want 200", w.Code)
	}
	gzEtag := get("GET", "/app.css", "Accept-Encoding", "gzip").Result().Header.Get("ETag")
	if gzEtag == etag {
		t.Errorf("plain and gzip forms share the ETag %s", etag)
	}
	// HEAD and other methods.
	if w := get("HEAD", "/app.wasm"); w.Code != 200 || w.Body.Len() != 0 || w.Header().Get("Content-Length") != "8" {
		t.Errorf("HEAD: %d, %d bytes, Content-Length %q", w.Code, w.Body.Len(), w.Header().Get("Content-Length"))
	}
	if w := get("POST", "/index.html"); w.Code != http.StatusMethodNotAllowed || w.Header().Get("Allow") != "GET, HEAD" {
		t.Errorf("POST: %d, Allow %q", w.Code, w.Header().Get("Allow"))
	}
}

func TestWriteDir(t *testing.T) {
	b := assemble(t, static.FS)
	dir := filepath.Join(t.TempDir(), "dist")
	if err := b.WriteDir(dir); err != nil {
		t.Fatal(err)
	}
	for _, f := range b.Files {
		data, err := os.ReadFile(filepath.Join(dir, f.Name))
		if err != nil || !bytes.Equal(data, f.Data) {
			t.Errorf("%s: %v", f.Name, err)
		}
		gz, err := os.ReadFile(filepath.Join(dir, f.Name+".gz"))
		if err != nil || !bytes.Equal(gz, f.Gzip) {
			t.Errorf("%s.gz: %v", f.Name, err)
		}
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 2*len(b.Files) {
		t.Errorf("%d entries in %s, want %d", len(entries), dir, 2*len(b.Files))
	}
}

func TestIcons(t *testing.T) {
	icons := bundle.Icons()
	for name, size := range map[string]int{"icon-192.png": 192, "icon-512.png": 512, "apple-touch-icon.png": 180} {
		img, err := png.Decode(bytes.NewReader(icons[name]))
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if b := img.Bounds(); b.Dx() != size || b.Dy() != size {
			t.Errorf("%s is %v, want %d×%d", name, b, size, size)
		}
		// Sample points in icon units (512 grid): sky, ground, aquifer,
		// casing, pump head. Expected colours are the drawing's own.
		at := func(x, y int) [3]uint32 {
			r, g, b, _ := img.At(x*size/512, y*size/512).RGBA()
			return [3]uint32{r >> 8, g >> 8, b >> 8}
		}
		for _, c := range []struct {
			x, y int
			want [3]uint32
		}{
			{40, 60, [3]uint32{0x17, 0x41, 0x4d}},
			{40, 250, [3]uint32{0xc8, 0xb4, 0x8a}},
			{40, 470, [3]uint32{0x2f, 0x86, 0xa6}},
			{256, 300, [3]uint32{0xee, 0xf1, 0xec}},
			{256, 140, [3]uint32{0xf2, 0xa5, 0x41}},
		} {
			if got := at(c.x, c.y); got != c.want {
				t.Errorf("%s at (%d,%d): %x, want %x", name, c.x, c.y, got, c.want)
			}
		}
		// The cone: beside the well the water table is drawn down, so at
		// depth 330 the ground shows near the well but water far from it.
		if at(290, 330) != [3]uint32{0xc8, 0xb4, 0x8a} || at(470, 330) != [3]uint32{0x2f, 0x86, 0xa6} {
			t.Errorf("%s: no drawdown cone around the well", name)
		}
	}
	var svg struct {
		XMLName xml.Name
		Paths   []struct {
			Fill string `xml:"fill,attr"`
			D    string `xml:"d,attr"`
		} `xml:"path"`
	}
	if err := xml.Unmarshal(icons["icon.svg"], &svg); err != nil {
		t.Fatalf("icon.svg: %v", err)
	}
	if svg.XMLName.Local != "svg" || len(svg.Paths) < 5 || svg.Paths[0].Fill != "#17414d" {
		t.Errorf("icon.svg: %s with %d paths", svg.XMLName.Local, len(svg.Paths))
	}
}

func TestAcceptEncodingAndETag(t *testing.T) {
	// Exercised through the handler: whether index.html comes gzipped.
	b := assemble(t, static.FS)
	h := b.Handler()
	for header, want := range map[string]bool{
		"":                      false,
		"gzip":                  true,
		"GZIP":                  true,
		"x-gzip":                true,
		"deflate, gzip;q=0.5":   true,
		"gzip;q=0":              false,
		"gzip; q=0.000":         false,
		"*":                     true,
		"*;q=0":                 false,
		"gzip;q=0, *":           false,
		"br, *;q=0.1":           true,
		"identity":              false,
		"gzip;q=bogus":          false,
		" gzip ; q=1 , br;q=.9": true,
	} {
		req := httptest.NewRequest("GET", "/index.html", nil)
		req.Header.Set("Accept-Encoding", header)
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		if got := w.Header().Get("Content-Encoding") == "gzip"; got != want {
			t.Errorf("Accept-Encoding %q: gzip %v, want %v", header, got, want)
		}
	}
	f, _ := b.File("index.html")
	for header, want := range map[string]bool{
		f.ETag:                    true,
		"W/" + f.ETag:             true,
		`"x", ` + f.ETag:          true,
		"*":                       true,
		`"x"`:                     false,
		strings.Trim(f.ETag, `"`): false,
	} {
		req := httptest.NewRequest("GET", "/index.html", nil)
		req.Header.Set("If-None-Match", header)
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		if got := w.Code == 304; got != want {
			t.Errorf("If-None-Match %q: 304 %v, want %v", header, got, want)
		}
	}
}

func FuzzHandlerHeaders(f *testing.F) {
	b, err := bundle.Assemble(fakeWasm, fakeExec, static.FS)
	if err != nil {
		f.Fatal(err)
	}
	h := b.Handler()
	f.Add("/index.html", "gzip;q=0.5", `"abc"`)
	f.Add("/", "*;q=", "W/")
	f.Add("/a/../../sw.js", ";;,,q=1e400", "*, ")
	f.Fuzz(func(t *testing.T, path, accept, inm string) {
		req, err := http.NewRequest("GET", "http://x/", nil)
		if err != nil {
			t.Skip()
		}
		req.URL.Path = path
		req.Header.Set("Accept-Encoding", accept)
		req.Header.Set("If-None-Match", inm)
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		switch w.Code {
		case 200, 304, 404:
		default:
			t.Fatalf("status %d for %q %q %q", w.Code, path, accept, inm)
		}
		if w.Header().Get("Content-Security-Policy") != bundle.CSP {
			t.Fatal("no CSP")
		}
	})
}

// The real compile, once per test binary: it takes 10–30 s.
var (
	buildOnce sync.Once
	built     *bundle.Bundle
	buildErr  error
)

func probeBundle(t *testing.T) *bundle.Bundle {
	t.Helper()
	buildOnce.Do(func() {
		built, buildErr = bundle.Build(context.Background(), bundle.Options{Package: "./web/webtest/testdata/storeprobe"})
	})
	if buildErr != nil {
		t.Fatal(buildErr)
	}
	return built
}

func TestBuild(t *testing.T) {
	if testing.Short() {
		t.Skip("compiles a WebAssembly program; skipped with -short")
	}
	b := probeBundle(t)
	wasm, _ := b.File("app.wasm")
	if !bytes.HasPrefix(wasm.Data, []byte("\x00asm\x01\x00\x00\x00")) || len(wasm.Data) < 100_000 {
		t.Errorf("app.wasm: %d bytes, starts %q", len(wasm.Data), wasm.Data[:min(8, len(wasm.Data))])
	}
	want, err := os.ReadFile(filepath.Join(runtime.GOROOT(), "lib", "wasm", "wasm_exec.js"))
	if err != nil {
		t.Fatal(err)
	}
	exec, _ := b.File("wasm_exec.js")
	if !bytes.Equal(exec.Data, want) {
		t.Errorf("wasm_exec.js differs from the toolchain's copy")
	}
	if b.Compile <= 0 {
		t.Errorf("compile time %v", b.Compile)
	}
	raw, gz := b.Size()
	t.Logf("probe bundle %s: %d bytes, %d gzipped, compiled in %v", b.Version, raw, gz, b.Compile)
}

func TestBuildErrors(t *testing.T) {
	ctx := context.Background()
	_, err := bundle.Build(ctx, bundle.Options{Dir: t.TempDir()})
	if err == nil || !strings.Contains(err.Error(), "not inside a Go module") {
		t.Errorf("outside a module: %v", err)
	}
	_, err = bundle.Build(ctx, bundle.Options{Package: "./no/such/package"})
	if err == nil || !strings.Contains(err.Error(), "no package ./no/such/package") {
		t.Errorf("missing package: %v", err)
	}
	_, err = bundle.Build(ctx, bundle.Options{Package: "./web/webtest/testdata/storeprobe", Extra: []string{"ui/no-such.css"}})
	if err == nil || !strings.Contains(err.Error(), "extra file") {
		t.Errorf("missing extra file: %v", err)
	}
	_, err = bundle.Build(ctx, bundle.Options{Go: filepath.Join(t.TempDir(), "no-go")})
	if err == nil {
		t.Errorf("missing go command: no error")
	}
}
