package export

import (
	"bytes"
	"encoding/base64"
	"encoding/xml"
	stdhtml "html"
	"io"
	"regexp"
	"strings"
	"testing"
)

// dataURI finds the embedded maps; html/template writes the URI's "+" as
// the character reference "&#43;", which browsers decode.
var dataURI = regexp.MustCompile(`data:image/svg(?:\+|&#43;)xml;base64,([^"]+)`)

// TestReport checks the report's text against a golden file (with the
// embedded maps cut out), that every embedded map decodes to well-formed
// SVG, that nothing is fetched from outside, and that text from the input
// is escaped.
func TestReport(t *testing.T) {
	b := fixtureBundle(t, false)
	b.Title = `Harrow Lane <script>alert(1)</script> & "pad"`
	var buf bytes.Buffer
	if err := b.WriteReport(&buf); err != nil {
		t.Fatal(err)
	}
	html := buf.String()
	maps := dataURI.FindAllStringSubmatch(html, -1)
	if len(maps) != 2 {
		t.Fatalf("%d embedded maps, want 2", len(maps))
	}
	for _, m := range maps {
		checkSVG(t, stdhtml.UnescapeString(m[1]))
	}
	for _, bad := range []string{"<script", "http://", "https://", "src=\"/", "@import", "url("} {
		if strings.Contains(strings.ToLower(html), bad) {
			t.Errorf("report contains %q: it must be self-contained and script-free", bad)
		}
	}
	for _, want := range []string{"&lt;script&gt;", "Cautions", "SHA-256", "Z1", "S1", "made by isofield test",
		"=probe slipped"} {
		if !strings.Contains(html, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	golden(t, "report.html", []byte(dataURI.ReplaceAllString(html, "data:image/svg+xml;base64,…")))
}

// checkSVG decodes a base64 SVG and parses it as XML to its end.
func checkSVG(t *testing.T, b64 string) {
	t.Helper()
	raw, err := base64.StdEncoding.DecodeString(b64)
	if err != nil {
		t.Fatalf("embedded map: %v", err)
	}
	d := xml.NewDecoder(bytes.NewReader(raw))
	root := ""
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("embedded map is not well-formed XML: %v", err)
		}
		if se, ok := tok.(xml.StartElement); ok && root == "" {
			root = se.Name.Local
		}
	}
	if root != "svg" {
		t.Errorf("embedded map's root element is %q, want svg", root)
	}
}

func BenchmarkReport(b *testing.B) {
	for b.Loop() {
		if err := fixtureBundle(b, false).WriteReport(io.Discard); err != nil {
			b.Fatal(err)
		}
	}
}
