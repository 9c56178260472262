package main

import (
	"bytes"
	"context"
	"encoding/json"
	"os"
	osexec "os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"
	"time"
)

// maxPrintedPages is what the report of a frame of 45 members (and the
// demo's 35) may print to: 15 pages or fewer, a package a checker reads in one sitting.
const maxPrintedPages = 15

// chromiumPath returns the headless browser's path, or skips the test
// with a message when none is installed.
func chromiumPath(t *testing.T) string {
	t.Helper()
	for _, p := range []string{"/usr/bin/chromium", "/usr/bin/chromium-browser"} {
		if _, err := os.Stat(p); err == nil {
			return p
		}
	}
	t.Skip("chromium is not installed (/usr/bin/chromium): the report is not printed; install it (the CI script does) to run this test")
	return ""
}

// chromium runs the browser headless on a page with the extra flags and
// returns its standard output.
func chromium(t *testing.T, browser, dir, page string, flags ...string) []byte {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 120*time.Second)
	defer cancel()
	args := append([]string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
		"--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--user-data-dir=" + filepath.Join(dir, "profile")}, flags...)
	cmd := osexec.CommandContext(ctx, browser, append(args, "file://"+page)...)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	if err := cmd.Run(); err != nil {
		t.Fatalf("%s: %v\n%s", browser, err, stderr.String())
	}
	return stdout.Bytes()
}

// pageObject matches a page object of a PDF, not the page tree (/Pages).
var pageObject = regexp.MustCompile(`/Type\s*/Page[^s]`)

// overlapScript measures, in the browser, the box of every text of every
// drawing and lists the pairs in one drawing that overlap by more than
// half a pixel both ways; it writes the result into the page as JSON.
const overlapScript = `<script>
(function () {
  var res = {texts: 0, overlaps: []};
  document.querySelectorAll('svg').forEach(function (svg, k) {
    var boxes = [];
    svg.querySelectorAll('text').forEach(function (t) {
      var r = t.getBoundingClientRect();
      boxes.push({l: r.left, t: r.top, r: r.right, b: r.bottom, s: t.textContent});
    });
    res.texts += boxes.length;
    for (var i = 0; i < boxes.length; i++) {
      for (var j = i + 1; j < boxes.length; j++) {
        var a = boxes[i], b = boxes[j];
        var w = Math.min(a.r, b.r) - Math.max(a.l, b.l), h = Math.min(a.b, b.b) - Math.max(a.t, b.t);
        if (w > 0.5 && h > 0.5) {
          res.overlaps.push('drawing ' + k + ': "' + a.s + '" and "' + b.s + '"');
        }
      }
    }
  });
  var pre = document.createElement('pre');
  pre.id = 'overlaps';
  pre.textContent = JSON.stringify(res);
  document.body.appendChild(pre);
})();
</script>`

// oddFrame writes the starting model of a frame with a short bay between
// two long ones and a short storey between two tall ones, whose labels
// crowd at the joints: placed where they stand by default, many overlap.
// It returns the model's path.
func oddFrame(t *testing.T) string { return startingFrame(t, "8,1.2,8", "4,0.8,3.5") }

// startingFrame writes the starting model of the bays and storeys given
// and returns its path.
func startingFrame(t *testing.T, bays, storeys string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "frame.toml")
	var stdout, stderr bytes.Buffer
	if code := govern([]string{"new", "--bays", bays, "--storeys", storeys, path}, &stdout, &stderr); code != 0 {
		t.Fatalf("govern new: exit %d: %s", code, stderr.String())
	}
	return path
}

// TestReportPrintsInChromium prints the report of the demo and of a frame
// of 45 members (four bays, five storeys) to PDF in headless Chromium and
// counts its pages, at most maxPrintedPages; and measures in the browser
// every label of every drawing of those, of a frame whose joints crowd
// (oddFrame) and of one whose moments are drawn floor by floor as well
// (TestDenseDrawingGetsAFloorByFloorOne), of which none may overlap
// another.
func TestReportPrintsInChromium(t *testing.T) {
	browser := chromiumPath(t)
	demo := filepath.Join(t.TempDir(), "demo.toml")
	if err := os.WriteFile(demo, demoModel, 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name, model string
		pages       bool // count the printed pages
	}{{"demo", demo, true}, {"45 members", frame45(t), true}, {"crowded joints", oddFrame(t), false},
		{"short bays, drawn floor by floor", startingFrame(t, "6,0.6,6,0.6,6", "3.5x4"), false}} {
		t.Run(c.name, func(t *testing.T) {
			a, src := reportOf(t, c.model)
			if n := len(a.Job.Model.Members); c.name == "45 members" && n != 45 {
				t.Fatalf("the frame has %d members, not 45", n)
			}
			dir := t.TempDir()
			page := filepath.Join(dir, "report.html")
			if err := os.WriteFile(page, src, 0o644); err != nil {
				t.Fatal(err)
			}
			if c.pages {
				t.Run("pages", func(t *testing.T) {
					pdf := filepath.Join(dir, "report.pdf")
					chromium(t, browser, dir, page, "--no-pdf-header-footer", "--print-to-pdf="+pdf)
					b, err := os.ReadFile(pdf)
					if err != nil {
						t.Fatal(err)
					}
					n := len(pageObject.FindAll(b, -1))
					if n == 0 || n > maxPrintedPages {
						t.Errorf("the report prints to %d pages, want 1 to %d", n, maxPrintedPages)
					}
					t.Logf("%d pages", n)
				})
			}
			t.Run("labels", func(t *testing.T) {
				// A copy of the page with the measuring script: the report
				// itself has none.
				probe := filepath.Join(dir, "probe.html")
				withScript := strings.Replace(string(src), "</body>", overlapScript+"</body>", 1)
				if err := os.WriteFile(probe, []byte(withScript), 0o644); err != nil {
					t.Fatal(err)
				}
				dom := chromium(t, browser, dir, probe, "--window-size=1400,1000", "--dump-dom")
				m := regexp.MustCompile(`<pre id="overlaps">([^<]*)</pre>`).FindSubmatch(dom)
				if m == nil {
					t.Fatalf("the page script gave no result:\n%.2000s", dom)
				}
				var res struct {
					Texts    int      `json:"texts"`
					Overlaps []string `json:"overlaps"`
				}
				if err := json.Unmarshal([]byte(strings.ReplaceAll(string(m[1]), "&amp;", "&")), &res); err != nil {
					t.Fatalf("%v: %s", err, m[1])
				}
				if res.Texts < len(a.Job.Model.Members) {
					t.Fatalf("%d labels measured: the drawings were not measured", res.Texts)
				}
				for _, o := range res.Overlaps {
					t.Errorf("labels overlap: %s", o)
				}
				t.Logf("%d labels measured, %d overlaps", res.Texts, len(res.Overlaps))
			})
		})
	}
}

// TestDenseDrawingGetsAFloorByFloorOne: where the moment drawing of the
// whole frame has no room for every value (short bays between long ones:
// the short beams' end values crowd the joints), the beams are drawn
// again floor by floor, each floor's drawing holding the envelopes of
// that floor's beams and no other; where every value has room there is
// no such drawing.
func TestDenseDrawingGetsAFloorByFloorOne(t *testing.T) {
	for _, c := range []struct {
		name, bays string
		floors     bool
	}{{"short bays between long ones", "6,0.6,6,0.6,6", true}, {"even bays", "6x4", false}} {
		t.Run(c.name, func(t *testing.T) {
			path := filepath.Join(t.TempDir(), "frame.toml")
			if code, _, stderr := exec("new", "--bays", c.bays, "--storeys", "3.5x4", path); code != 0 {
				t.Fatalf("govern new: %s", stderr)
			}
			a, src := reportOf(t, path)
			root := parseXML(t, src)
			moment := byID(root, "moment")
			if moment == nil {
				t.Fatal("no moment section")
			}
			floors := moment.find(func(e *element) bool { return e.name == "figure" && e.attr["class"] == "floor" })
			caption := moment.find(func(e *element) bool { return e.name == "figcaption" })[0].allText()
			if dropped := strings.Contains(caption, "left out"); dropped != c.floors {
				t.Fatalf("values left out: %v, want %v: %s", dropped, c.floors, caption)
			}
			if !c.floors {
				if len(floors) != 0 {
					t.Errorf("%d floor drawings where every value has room", len(floors))
				}
				return
			}
			mo := a.Job.Model
			var levels []float64 // the heights of the floors of beams
			for m := range mo.Members {
				if y := mo.Nodes[mo.Members[m].Start].Y; mo.IsBeam(m) && !slices.Contains(levels, y) {
					levels = append(levels, y)
				}
			}
			if len(floors) != len(levels) {
				t.Fatalf("%d floor drawings, want one per floor: %d", len(floors), len(levels))
			}
			for _, f := range floors {
				var ys []float64
				for _, g := range f.find(func(e *element) bool { return e.name == "g" && e.attr["class"] == "env" }) {
					for m, mem := range mo.Members {
						if mem.Name == g.attr["data-member"] {
							if !mo.IsBeam(m) {
								t.Errorf("column %s drawn on a floor", mem.Name)
							}
							if y := mo.Nodes[mem.Start].Y; !slices.Contains(ys, y) {
								ys = append(ys, y)
							}
						}
					}
				}
				if len(ys) != 1 {
					t.Errorf("a floor drawing holds beams at heights %v, want one floor", ys)
				}
			}
		})
	}
}
