package bundle

import (
	"net/http"
	"path"
	"strconv"
	"strings"
)

// Handler serves the bundle: "/" is index.html; every file goes out with
// its Content-Type (application/wasm for the program), the CSP and other
// safety headers, an ETag, "Cache-Control: no-cache" (the service worker
// does the caching), and its gzip form when the client accepts gzip and
// that form is smaller. Only GET and HEAD are allowed.
func (b *Bundle) Handler() http.Handler {
	return http.HandlerFunc(b.serve)
}

func setSecurityHeaders(h http.Header) {
	h.Set("Content-Security-Policy", CSP)
	h.Set("X-Content-Type-Options", "nosniff")
	h.Set("Referrer-Policy", "no-referrer")
	h.Set("Cross-Origin-Opener-Policy", "same-origin")
	h.Set("Cross-Origin-Resource-Policy", "same-origin")
}

func (b *Bundle) serve(w http.ResponseWriter, r *http.Request) {
	h := w.Header()
	setSecurityHeaders(h)
	if r.Method != http.MethodGet && r.Method != http.MethodHead {
		h.Set("Allow", "GET, HEAD")
		http.Error(w, "method not allowed", http.StatusMethodNotAllowed)
		return
	}
	name := strings.TrimPrefix(path.Clean("/"+r.URL.Path), "/")
	if name == "" {
		name = IndexFile
	}
	f, ok := b.File(name)
	if !ok {
		http.Error(w, "not found: /"+name, http.StatusNotFound)
		return
	}
	h.Set("Content-Type", f.Type)
	h.Set("Cache-Control", "no-cache")
	h.Add("Vary", "Accept-Encoding")
	body, etag := f.Data, f.ETag
	if len(f.Gzip) > 0 && len(f.Gzip) < len(f.Data) && acceptsGzip(r.Header.Get("Accept-Encoding")) {
		body = f.Gzip
		etag = strings.TrimSuffix(f.ETag, `"`) + `-gz"`
		h.Set("Content-Encoding", "gzip")
	}
	h.Set("ETag", etag)
	if etagMatch(r.Header.Get("If-None-Match"), etag) {
		h.Del("Content-Type")
		w.WriteHeader(http.StatusNotModified)
		return
	}
	h.Set("Content-Length", strconv.Itoa(len(body)))
	w.WriteHeader(http.StatusOK)
	if r.Method != http.MethodHead {
		w.Write(body)
	}
}

// acceptsGzip reports whether an Accept-Encoding header value allows gzip
// (RFC 9110, section 12.5.3): "gzip" or "*" with a q-value above zero.
func acceptsGzip(header string) bool {
	gzip, star := -1.0, -1.0
	for part := range strings.SplitSeq(header, ",") {
		coding, params, _ := strings.Cut(strings.TrimSpace(part), ";")
		coding = strings.ToLower(strings.TrimSpace(coding))
		q := 1.0
		for p := range strings.SplitSeq(params, ";") {
			k, v, ok := strings.Cut(strings.TrimSpace(p), "=")
			if ok && strings.EqualFold(strings.TrimSpace(k), "q") {
				if f, err := strconv.ParseFloat(strings.TrimSpace(v), 64); err == nil {
					q = f
				} else {
					q = 0
				}
			}
		}
		switch coding {
		case "gzip", "x-gzip":
			gzip = q
		case "*":
			star = q
		}
	}
	if gzip >= 0 {
		return gzip > 0
	}
	return star > 0
}

// etagMatch reports whether an If-None-Match header value names etag
// (weak comparison, RFC 9110, section 13.1.2).
func etagMatch(header, etag string) bool {
	if header == "" {
		return false
	}
	if strings.TrimSpace(header) == "*" {
		return true
	}
	for part := range strings.SplitSeq(header, ",") {
		if strings.TrimPrefix(strings.TrimSpace(part), "W/") == etag {
			return true
		}
	}
	return false
}
