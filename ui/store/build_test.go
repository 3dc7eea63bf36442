package store_test

import (
	"go/build/constraint"
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestBrowserFilesAreTagged checks that every file of the package that
// imports syscall/js or the IndexedDB library is built only for js/wasm,
// so that the native build and its tests never reach the browser.
func TestBrowserFilesAreTagged(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	sub, _ := filepath.Glob("*/*.go")
	files = append(files, sub...)
	wasm := map[string]bool{"GOOS=js": false, "js": true, "wasm": true}
	checked := 0
	for _, name := range files {
		src, err := os.ReadFile(name)
		if err != nil {
			t.Fatal(err)
		}
		f, err := parser.ParseFile(token.NewFileSet(), name, src, parser.ImportsOnly|parser.ParseComments)
		if err != nil {
			t.Fatal(err)
		}
		browser := false
		for _, imp := range f.Imports {
			p, _ := strconv.Unquote(imp.Path.Value)
			if p == "syscall/js" || strings.HasPrefix(p, "github.com/hack-pad/") {
				browser = true
			}
		}
		if !browser {
			continue
		}
		checked++
		var expr constraint.Expr
		for _, line := range strings.Split(string(src), "\n") {
			if constraint.IsGoBuild(line) {
				expr, err = constraint.Parse(line)
				if err != nil {
					t.Fatalf("%s: %v", name, err)
				}
				break
			}
		}
		if expr == nil || expr.Eval(func(tag string) bool { return tag == "linux" || tag == "amd64" }) ||
			!expr.Eval(func(tag string) bool { return wasm[tag] }) {
			t.Errorf("%s imports browser packages but is not built for js && wasm only", name)
		}
	}
	if checked == 0 {
		t.Error("found no browser file to check; the test looks in the wrong place")
	}
}
