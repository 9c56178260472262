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
