package main

import (
	"bytes"
	"context"
	"encoding/xml"
	"image"
	"image/png"
	"io"
	"os"
	osexec "os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"govern/cmd/govern/modelfile"
	"govern/envelope/analysis"
	"govern/envelope/report"
)

// smallModel is the model of the golden files: faces, a hinge, patterned
// live load, wind and service combinations.
const smallModel = "../../testdata/output/small.toml"

// element is a parsed XML element.
type element struct {
	name     string
	attr     map[string]string
	children []*element
	text     strings.Builder
}

// parseXML parses src strictly as XML (the report is written well-formed)
// and returns its root element.
func parseXML(t *testing.T, src []byte) *element {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(src))
	d.Strict = true
	var stack []*element
	var root *element
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			line, col := d.InputPos()
			t.Fatalf("not well-formed at line %d, column %d: %v", line, col, err)
		}
		switch tok := tok.(type) {
		case xml.StartElement:
			e := &element{name: tok.Name.Local, attr: map[string]string{}}
			for _, a := range tok.Attr {
				e.attr[a.Name.Local] = a.Value
			}
			if len(stack) > 0 {
				p := stack[len(stack)-1]
				p.children = append(p.children, e)
			} else if root == nil {
				root = e
			} else {
				t.Fatal("more than one root element")
			}
			stack = append(stack, e)
		case xml.EndElement:
			stack = stack[:len(stack)-1]
		case xml.CharData:
			if len(stack) > 0 {
				stack[len(stack)-1].text.Write(tok)
			}
		case xml.Directive:
			if !bytes.Equal(tok, []byte("DOCTYPE html")) {
				t.Errorf("directive %q", tok)
			}
		}
	}
	if root == nil {
		t.Fatal("no root element")
	}
	return root
}

// find returns every element below e (e included) that f accepts.
func (e *element) find(f func(*element) bool) []*element {
	var out []*element
	if f(e) {
		out = append(out, e)
	}
	for _, c := range e.children {
		out = append(out, c.find(f)...)
	}
	return out
}

// allText returns the text of e and everything below it.
func (e *element) allText() string {
	var b strings.Builder
	b.WriteString(e.text.String())
	for _, c := range e.children {
		b.WriteString(c.allText())
	}
	return b.String()
}

func byID(root *element, id string) *element {
	if es := root.find(func(e *element) bool { return e.attr["id"] == id }); len(es) == 1 {
		return es[0]
	}
	return nil
}

// reportOf analyses the model at path and returns its report.
func reportOf(t *testing.T, path string) (*analysis.Result, []byte) {
	t.Helper()
	job, err := loadModel(path)
	if err != nil {
		t.Fatal(err)
	}
	a, err := analyseJob(job)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := report.New(a).WriteHTML(&b); err != nil {
		t.Fatal(err)
	}
	return a, b.Bytes()
}

func TestReportIsValidAndComplete(t *testing.T) {
	demo := filepath.Join(t.TempDir(), "demo.toml")
	if err := os.WriteFile(demo, demoModel, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, path := range []string{smallModel, demo} {
		t.Run(filepath.Base(path), func(t *testing.T) {
			a, src := reportOf(t, path)
			root := parseXML(t, src)
			mo := a.Job.Model
			if root.name != "html" || len(root.find(func(e *element) bool { return e.name == "title" })) != 1 {
				t.Fatalf("root %s, or no title", root.name)
			}
			t.Run("self-contained: no script, nothing fetched", func(t *testing.T) {
				for _, e := range root.find(func(*element) bool { return true }) {
					if e.name == "script" || e.name == "link" || e.name == "img" || e.name == "iframe" || e.name == "object" {
						t.Errorf("element <%s>", e.name)
					}
					for k, v := range e.attr {
						if k == "src" || strings.HasPrefix(k, "on") || (k == "href" && !strings.HasPrefix(v, "#")) {
							t.Errorf("<%s %s=%q>", e.name, k, v)
						}
					}
				}
				if bytes.Contains(src, []byte("url(")) || bytes.Contains(src, []byte("@import")) {
					t.Error("the style sheet fetches something")
				}
			})
			t.Run("every member's envelope is drawn", func(t *testing.T) {
				figures := []string{"moment", "shear"}
				if len(a.Envelope.Service) > 0 {
					figures = append(figures, "deflection")
				}
				for _, id := range append(figures, "axial") {
					fig := byID(root, id)
					if fig == nil {
						t.Fatalf("no section %q", id)
					}
					drawn := map[string]*element{}
					for _, g := range fig.find(func(e *element) bool { return e.name == "g" && e.attr["class"] == "env" }) {
						drawn[g.attr["data-member"]] = g
					}
					for m, mem := range mo.Members {
						g := drawn[mem.Name]
						if id == "axial" && !mo.IsColumn(m) {
							if g != nil {
								t.Errorf("%s: beam %s drawn", id, mem.Name)
							}
							continue
						}
						if g == nil {
							t.Errorf("%s: no envelope of %s", id, mem.Name)
							continue
						}
						// A band between the curves, closed, and the two
						// curves, each through every station.
						n := len(a.Envelope.Members[m].Stations)
						for _, class := range []string{"band", "hi", "lo"} {
							ps := g.find(func(e *element) bool { return e.name == "path" && e.attr["class"] == class })
							want := n
							if class == "band" {
								want = 2 * n
							}
							if len(ps) != 1 || strings.Count(ps[0].attr["d"], "M")+strings.Count(ps[0].attr["d"], "L") != want {
								t.Errorf("%s, %s: %s path %v, want one through %d points", id, mem.Name, class, ps, want)
							}
						}
					}
				}
			})
			t.Run("elevation names every node and member and draws supports", func(t *testing.T) {
				el := byID(root, "elevation")
				text := el.allText()
				for _, n := range mo.Nodes {
					if !strings.Contains(text, n.Name) {
						t.Errorf("node %s not named", n.Name)
					}
				}
				for _, m := range mo.Members {
					if !strings.Contains(text, m.Name) {
						t.Errorf("member %s not named", m.Name)
					}
				}
				sup := el.find(func(e *element) bool { return e.attr["class"] == "sup" })
				if len(sup) != 1 || len(sup[0].children) == 0 {
					t.Error("no supports drawn")
				}
			})
			t.Run("tables: stations of every member, reactions, combinations, statics, caution", func(t *testing.T) {
				heads := map[string]bool{}
				for _, tr := range root.find(func(e *element) bool { return e.name == "tr" && e.attr["class"] == "mh" }) {
					heads[strings.SplitN(tr.allText(), ":", 2)[0]] = true
				}
				for _, m := range mo.Members {
					if !heads[m.Name] {
						t.Errorf("no station rows for %s", m.Name)
					}
				}
				combos := byID(root, "combinations").allText()
				for _, cb := range a.Envelope.Combinations {
					if !strings.Contains(combos, cb.Name) {
						t.Errorf("combination %s not listed", cb.Name)
					}
				}
				statics := byID(root, "statics").allText()
				for _, c := range mo.Cases {
					if !strings.Contains(statics, c.Name) {
						t.Errorf("case %s has no statics check", c.Name)
					}
				}
				if byID(root, "reactions") == nil || strings.Count(root.allText(), report.Caution) != 2 {
					t.Error("no reactions section, or the caution not at the head and the foot")
				}
			})
		})
	}
	t.Run("faces are marked in the station tables", func(t *testing.T) {
		_, src := reportOf(t, smallModel)
		root := parseXML(t, src)
		if rows := root.find(func(e *element) bool { return e.name == "tr" && e.attr["class"] == "face" }); len(rows) != 8 {
			t.Errorf("%d face rows, want 8 (two per beam)", len(rows))
		}
	})
}

// TestReportStreams checks that the report of a large frame is written as
// it is formed: what the writer holds at once stays small (the buffered
// writer's 64 KiB), however long the report.
func TestReportStreams(t *testing.T) {
	var src bytes.Buffer
	if err := modelfile.WriteStarter(&src, regularSpec(6, 8)); err != nil {
		t.Fatal(err)
	}
	job, err := modelfile.Read("gen.toml", src.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	a, err := analyseJob(job)
	if err != nil {
		t.Fatal(err)
	}
	w := &largestWrite{}
	if err := report.New(a).WriteHTML(w); err != nil {
		t.Fatal(err)
	}
	if w.total < 1<<20 || w.largest > 1<<16 {
		t.Errorf("%d bytes in writes of at most %d; want a report over 1 MiB written 64 KiB at a time", w.total, w.largest)
	}
}

type largestWrite struct{ total, largest int }

func (w *largestWrite) Write(p []byte) (int, error) {
	w.total += len(p)
	w.largest = max(w.largest, len(p))
	return len(p), nil
}

// TestReportRendersInChromium opens the report in a headless browser,
// where one is installed, and checks that the picture it makes is not
// blank: mostly white paper, with dark text and the red and blue of the
// envelope curves.
func TestReportRendersInChromium(t *testing.T) {
	browser := ""
	for _, p := range []string{"/usr/bin/chromium", "/usr/bin/chromium-browser"} {
		if _, err := os.Stat(p); err == nil {
			browser = p
			break
		}
	}
	if browser == "" {
		t.Skip("chromium is not installed (/usr/bin/chromium): the report is not rendered; install it to run this test")
	}
	dir := t.TempDir()
	_, src := reportOf(t, smallModel)
	page := filepath.Join(dir, "report.html")
	if err := os.WriteFile(page, src, 0o644); err != nil {
		t.Fatal(err)
	}
	shot := filepath.Join(dir, "report.png")
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	cmd := osexec.CommandContext(ctx, browser, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--user-data-dir="+filepath.Join(dir, "profile"), "--screenshot="+shot, "--window-size=1200,4000", "file://"+page)
	if out, err := cmd.CombinedOutput(); err != nil {
		t.Fatalf("%s: %v\n%s", browser, err, out)
	}
	f, err := os.Open(shot)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatal(err)
	}
	white, dark, red, blue, total := 0, 0, 0, 0, 0
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl := rgb(img, x, y)
			total++
			switch {
			case r > 240 && g > 240 && bl > 240:
				white++
			case r < 90 && g < 90 && bl < 90:
				dark++
			case r > 140 && g < 90 && bl < 90:
				red++
			case bl > 120 && r < 90 && g < 130:
				blue++
			}
		}
	}
	t.Logf("%dx%d: %d white, %d dark, %d red, %d blue pixels", b.Dx(), b.Dy(), white, dark, red, blue)
	if white > total*99/100 || white < total/2 || dark < total/1000 || red == 0 || blue == 0 {
		t.Errorf("the rendered report looks blank or wrong: %d white, %d dark, %d red, %d blue of %d pixels", white, dark, red, blue, total)
	}
}

func rgb(img image.Image, x, y int) (r, g, b uint32) {
	r, g, b, _ = img.At(x, y).RGBA()
	return r >> 8, g >> 8, b >> 8
}

func TestRunReportAndOut(t *testing.T) {
	model := writeDemo(t)
	dir := filepath.Dir(model)
	t.Run("--report writes the page and the summary is printed", func(t *testing.T) {
		page := filepath.Join(dir, "r.html")
		code, out, stderr := exec("run", model, "--report", page)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		src, err := os.ReadFile(page)
		if err != nil {
			t.Fatal(err)
		}
		parseXML(t, src)
		if !strings.Contains(out, "Governing design values") {
			t.Error("summary not printed")
		}
	})
	t.Run("--report - goes to standard output alone", func(t *testing.T) {
		code, out, stderr := exec("run", model, "--report", "-")
		if code != 0 || !strings.HasPrefix(out, "<!DOCTYPE html>") || strings.Contains(out, "Governing design values (") {
			t.Errorf("exit %d, %s; output starts %.40q", code, stderr, out)
		}
	})
	t.Run("--out writes the three files into a new folder", func(t *testing.T) {
		out := filepath.Join(dir, "results", "run1")
		code, _, stderr := exec("run", "--quiet", "--out", out, model)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		for _, name := range []string{reportName, jsonName, csvName, casesName} {
			if st, err := os.Stat(filepath.Join(out, name)); err != nil || st.Size() == 0 {
				t.Errorf("%s: %v", name, err)
			}
		}
		// And again into the folder now there: replaced whole.
		if code, _, stderr := exec("run", "--quiet", "--out", out, model); code != 0 {
			t.Errorf("second run: exit %d: %s", code, stderr)
		}
	})
	t.Run("--out onto a file is an error and writes nothing", func(t *testing.T) {
		code, _, stderr := exec("run", "--quiet", "--out", model, model)
		if code != 1 || !strings.Contains(stderr, "it is a file, not a folder") {
			t.Errorf("exit %d: %s", code, stderr)
		}
	})
	for _, tc := range []struct {
		name string
		args []string
		msg  string
	}{
		{"--out with --json", []string{"--out", dir, "--json", "x.json"}, "--out writes report.html, envelopes.json, envelopes.csv and cases.csv"},
		{"two to standard output", []string{"--report", "-", "--csv", "-"}, "only one of --json, --csv, --cases-csv, --design-csv and --report can go to standard output"},
		{"--out to standard output", []string{"--out", "-"}, "--out names a folder"},
		{"--compare-patterns with --report", []string{"--compare-patterns", "--report", "x.html"}, "--compare-patterns writes no files"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code, _, stderr := exec(append(append([]string{"run"}, tc.args...), model)...)
			if code != 2 || !strings.Contains(stderr, tc.msg) {
				t.Errorf("exit %d: %s", code, stderr)
			}
		})
	}
	t.Run("the report never overwrites the model", func(t *testing.T) {
		code, _, stderr := exec("run", "--report", model, model)
		if code != 1 || !strings.Contains(stderr, "it is the model file") {
			t.Errorf("exit %d, %s", code, stderr)
		}
		if src, _ := os.ReadFile(model); !bytes.Equal(src, demoModel) {
			t.Error("model file changed")
		}
	})
}
