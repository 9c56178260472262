package main

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"
)

// modelNumbers returns every number the model file gives (the values of
// its keys, in tables, arrays and inline tables; not the digits of names
// or comments), with the key each is under.
func modelNumbers(t *testing.T, src []byte) map[string]float64 {
	t.Helper()
	var doc map[string]any
	if _, err := toml.Decode(string(src), &doc); err != nil {
		t.Fatal(err)
	}
	out := map[string]float64{}
	var walk func(path string, v any)
	walk = func(path string, v any) {
		switch x := v.(type) {
		case map[string]any:
			for k, e := range x {
				walk(path+"."+k, e)
			}
		case []map[string]any:
			for i, e := range x {
				walk(fmt.Sprintf("%s[%d]", path, i), e)
			}
		case []any:
			for i, e := range x {
				walk(fmt.Sprintf("%s[%d]", path, i), e)
			}
		case float64:
			out[path] = x
		case int64:
			out[path] = float64(x)
		}
	}
	walk("", doc)
	return out
}

var numberRe = regexp.MustCompile(`[-+]?[0-9]+(\.[0-9]+)?([eE][-+]?[0-9]+)?`)

// reportNumbers returns every number in the text of the report: the
// characters of its elements, style sheet left out, as a reader sees them.
func reportNumbers(t *testing.T, page []byte) []float64 {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(page))
	d.Strict = false
	d.Entity = xml.HTMLEntity
	var out []float64
	inStyle := false
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			t.Fatal(err)
		}
		switch x := tok.(type) {
		case xml.StartElement:
			inStyle = x.Name.Local == "style"
		case xml.EndElement:
			inStyle = false
		case xml.CharData:
			if inStyle {
				continue
			}
			for _, s := range numberRe.FindAllString(string(x), -1) {
				if v, err := strconv.ParseFloat(s, 64); err == nil {
					out = append(out, v)
				}
			}
		}
	}
	return out
}

// echoTol is how close a number of the report must be to the model's: the
// report writes ten significant digits (report.outputDigits).
const echoTol = 1e-9

// TestReportEchoesEveryInput: every number of the model file is in the
// text of its report (the input echo: nodes, members, sections, loads as
// entered and as applied, combinations, settings), for the demonstration
// model and a model with a load of every type, springs, a hinge, area
// loads, a patterned case and a settlement.
func TestReportEchoesEveryInput(t *testing.T) {
	demo := filepath.Join(t.TempDir(), "demo.toml")
	if err := os.WriteFile(demo, demoModel, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, model := range []string{demo, "../../testdata/every-load.toml"} {
		t.Run(filepath.Base(model), func(t *testing.T) {
			src, err := os.ReadFile(model)
			if err != nil {
				t.Fatal(err)
			}
			page := filepath.Join(t.TempDir(), "report.html")
			if code, _, stderr := exec("run", "--quiet", "--report", page, model); code != 0 {
				t.Fatalf("exit %d: %s", code, stderr)
			}
			html, err := os.ReadFile(page)
			if err != nil {
				t.Fatal(err)
			}
			shown := reportNumbers(t, html)
			want := modelNumbers(t, src)
			if len(want) < 30 {
				t.Fatalf("only %d numbers in the model", len(want))
			}
			var missing []string
			for key, v := range want {
				found := false
				for _, r := range shown {
					if math.Abs(r-v) <= echoTol*math.Abs(v) {
						found = true
						break
					}
				}
				if !found {
					missing = append(missing, fmt.Sprintf("%s = %v", key, v))
				}
			}
			sort.Strings(missing)
			if len(missing) > 0 {
				t.Errorf("%d of %d numbers of the model are not in its report:\n%s", len(missing), len(want), strings.Join(missing, "\n"))
			}
		})
	}
}

// loadDrawing returns the arrows (x1, y1, x2, y2 of each line) and the
// texts of the loading drawing of case number c (from 1) of a report.
func loadDrawing(t *testing.T, page []byte, c int) (arrows [][4]float64, texts []string) {
	t.Helper()
	s := string(page)
	i := strings.Index(s, fmt.Sprintf(`<section id="loads-%d">`, c))
	if i < 0 {
		t.Fatalf("no loads of case %d", c)
	}
	i += strings.Index(s[i:], `<g class="ld"`)
	j := i + strings.Index(s[i:], "</svg>")
	d := xml.NewDecoder(strings.NewReader(s[i:j]))
	inText := false
	for {
		tok, err := d.Token()
		if err != nil {
			break
		}
		switch x := tok.(type) {
		case xml.StartElement:
			switch x.Name.Local {
			case "line":
				var a [4]float64
				for _, at := range x.Attr {
					k := strings.Index("x1y1x2y2", at.Name.Local) / 2
					a[k], _ = strconv.ParseFloat(at.Value, 64)
				}
				arrows = append(arrows, a)
			case "text":
				inText = true
			}
		case xml.EndElement:
			inText = false
		case xml.CharData:
			if inText {
				texts = append(texts, string(x))
			}
		}
	}
	return arrows, texts
}

// TestLoadDrawing: the loading drawings of testdata/every-load.toml point
// each arrow the way its load acts (the picture's y runs down): case D's
// point load of 17.5 kN (gravity, positive down) from above; case W's
// node load fx = 13.25 (written 13.2) and its point load of 3.35 along +X from the
// left, and its fy = −2.75 (down) from above; and write each value: the
// area load q × spacing, 3.15 × 4.25 = 13.3875 kN/m (written 13.4, as the
// envelopes' labels: four figures or so), and the varying load
// from 2.35 to 1.15 kN/m.
func TestLoadDrawing(t *testing.T) {
	page := filepath.Join(t.TempDir(), "r.html")
	if code, _, stderr := exec("run", "--quiet", "--report", page, "../../testdata/every-load.toml"); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	src, err := os.ReadFile(page)
	if err != nil {
		t.Fatal(err)
	}
	has := func(texts []string, want string) bool {
		for _, s := range texts {
			if s == want {
				return true
			}
		}
		return false
	}
	arrows, texts := loadDrawing(t, src, 1) // D
	if len(arrows) != 1 || !(arrows[0][0] == arrows[0][2] && arrows[0][1] < arrows[0][3]) {
		t.Errorf("case D arrows %v, want one pointing down", arrows)
	}
	for _, want := range []string{"17.5", "13.4", "2.35 to 1.15"} {
		if !has(texts, want) {
			t.Errorf("case D's drawing lacks %q (texts %q)", want, texts)
		}
	}
	arrows, texts = loadDrawing(t, src, 3) // W
	right, down := 0, 0
	for _, a := range arrows {
		switch {
		case a[1] == a[3] && a[0] < a[2]:
			right++
		case a[0] == a[2] && a[1] < a[3]:
			down++
		default:
			t.Errorf("case W arrow %v points neither right nor down", a)
		}
	}
	if right != 2 || down != 1 {
		t.Errorf("case W: %d arrows to the right, %d down; want 2 and 1", right, down)
	}
	for _, want := range []string{"13.2", "3.35", "-2.75", "4.35", "8.65"} {
		if !has(texts, want) {
			t.Errorf("case W's drawing lacks %q (texts %q)", want, texts)
		}
	}
}
