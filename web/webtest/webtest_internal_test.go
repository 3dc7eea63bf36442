package webtest

import (
	"path/filepath"
	"testing"
)

func TestSameOrigin(t *testing.T) {
	const origin = "http://127.0.0.1:41234"
	tests := []struct {
		url  string
		want bool
	}{
		{"http://127.0.0.1:41234/", true},
		{"http://127.0.0.1:41234/app.wasm?x=1", true},
		{"data:image/png;base64,AAAA", true},
		{"about:blank", true},
		{"blob:http://127.0.0.1:41234/0b5c-11", true},
		{"blob:http://127.0.0.1:9/0b5c-11", false},
		{"http://127.0.0.1:41235/", false},
		{"https://127.0.0.1:41234/", false},
		{"http://localhost:41234/", false},
		{"https://fonts.example/font.woff2", false},
		{"ws://127.0.0.1:41234/", false},
		{"chrome-extension://abc/x.js", false},
		{"::not a url", false},
	}
	for _, tt := range tests {
		if got := sameOrigin(tt.url, origin); got != tt.want {
			t.Errorf("sameOrigin(%q) = %v, want %v", tt.url, got, tt.want)
		}
	}
}

func TestGoCrash(t *testing.T) {
	for text, want := range map[string]bool{
		"panic: runtime error: index out of range [3] with length 3": true,
		"fatal error: all goroutines are asleep - deadlock!":         true,
		"goroutine 1 [running]:":                                     true,
		"Version change detected, closing DB...":                     false,
		"the word panic: in a sentence":                              false,
	} {
		if got := goCrash.MatchString(text); got != want {
			t.Errorf("goCrash(%q) = %v, want %v", text, got, want)
		}
	}
}

func TestShotsDir(t *testing.T) {
	t.Setenv("FIELDFIT_SHOTS", "/some/where")
	if got := ShotsDir(); got != "/some/where" {
		t.Errorf("ShotsDir with FIELDFIT_SHOTS: %q", got)
	}
	t.Setenv("FIELDFIT_SHOTS", "")
	if got := ShotsDir(); filepath.Base(got) != "fieldfit-screenshots" {
		t.Errorf("ShotsDir default: %q", got)
	}
}

func TestViewports(t *testing.T) {
	want := map[string][2]int64{"tablet-768x1024": {768, 1024}, "laptop-1280x800": {1280, 800}, "phone-390x844": {390, 844}}
	for _, v := range Viewports {
		if w, ok := want[v.Name]; !ok || w != [2]int64{v.Width, v.Height} {
			t.Errorf("viewport %+v", v)
		}
	}
	if len(Viewports) != 3 {
		t.Errorf("%d viewports", len(Viewports))
	}
}
