package main

import (
	"bytes"
	"crypto/sha256"
	"encoding/csv"
	"encoding/hex"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"govern/envelope/report"
)

func TestVersion(t *testing.T) {
	want := report.ReadBuild().String() + "\n"
	for _, args := range [][]string{{"version"}, {"--version"}} {
		t.Run(strings.Join(args, " "), func(t *testing.T) {
			code, out, stderr := exec(args...)
			if code != 0 || out != want || stderr != "" {
				t.Errorf("exit %d, stdout %q, stderr %q; want %q", code, out, stderr, want)
			}
			if !strings.HasPrefix(out, "govern ") {
				t.Errorf("%q does not name govern", out)
			}
		})
	}
	if code, _, _ := exec("version", "x"); code != 2 {
		t.Errorf("version with an argument: exit %d, want 2", code)
	}
}

func TestBuildString(t *testing.T) {
	for _, tc := range []struct {
		b    report.Build
		want string
	}{
		{report.Build{Version: "(devel)"}, "govern (devel)"},
		{report.Build{Version: "v1.2.0", Revision: "0123abc"}, "govern v1.2.0 (revision 0123abc)"},
		{report.Build{Version: "v1.2.0", Revision: "0123abc", Modified: true}, "govern v1.2.0 (revision 0123abc, with changes not committed)"},
	} {
		if got := tc.b.String(); got != tc.want {
			t.Errorf("%+v: %q, want %q", tc.b, got, tc.want)
		}
	}
}

// TestSourceInEveryOutput: the JSON, the CSV and the report name the model
// file, its SHA-256 (computed here with crypto/sha256, FIPS 180-4), the
// version and the run date; the date is --date's, else SOURCE_DATE_EPOCH's,
// and two runs give the same bytes.
func TestSourceInEveryOutput(t *testing.T) {
	model := filepath.Join(t.TempDir(), "office frame.toml")
	src := append(append([]byte(nil), demoModel...), "\n[project]\nname = \"Block B <east>\"\nnumber = \"J-2041\"\nengineer = \"A. Engineer\"\nchecker = \"B. Checker\"\n"...)
	if err := os.WriteFile(model, src, 0o644); err != nil {
		t.Fatal(err)
	}
	sum := sha256.Sum256(src)
	hash := hex.EncodeToString(sum[:])
	version := report.ReadBuild().String()

	run := func(t *testing.T, args ...string) (js, cs, cases, page []byte) {
		t.Helper()
		dir := filepath.Join(t.TempDir(), "out")
		if code, _, stderr := exec(append(append([]string{"run", "--quiet", "--out", dir}, args...), model)...); code != 0 {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		read := func(n string) []byte {
			b, err := os.ReadFile(filepath.Join(dir, n))
			if err != nil {
				t.Fatal(err)
			}
			return b
		}
		return read(jsonName), read(csvName), read(casesName), read(reportName)
	}
	check := func(t *testing.T, js, cs, cases, page []byte, date string) {
		t.Helper()
		var doc struct {
			Source struct {
				Program, Version, Revision string
				Modified                   bool
				ModelFile                  string `json:"model_file"`
				SHA256, Date               string
				Project                    struct{ Name, Number, Engineer, Checker string }
			}
		}
		if err := json.Unmarshal(js, &doc); err != nil {
			t.Fatal(err)
		}
		s := doc.Source
		if s.ModelFile != "office frame.toml" || s.SHA256 != hash || s.Date != date || s.Program != "govern" || s.Version != report.ReadBuild().Version {
			t.Errorf("JSON source %+v, want file, SHA-256 %s, date %s", s, hash, date)
		}
		if p := s.Project; p.Name != "Block B <east>" || p.Number != "J-2041" || p.Engineer != "A. Engineer" || p.Checker != "B. Checker" {
			t.Errorf("JSON project %+v", p)
		}
		rows, err := csv.NewReader(bytes.NewReader(cs)).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		got := map[string]string{}
		for _, r := range rows[len(rows)-sourceRows:] {
			if r[0] != "" || r[1] != "" {
				t.Errorf("source row %q has a member or x", r)
			}
			got[r[2]] = r[3]
		}
		if want := map[string]string{"program": version, "model_file": "office frame.toml", "model_sha256": hash, "run_date": date}; !equalMaps(got, want) {
			t.Errorf("CSV source rows %v, want %v", got, want)
		}
		rows, err = csv.NewReader(bytes.NewReader(cases)).ReadAll()
		if err != nil {
			t.Fatal(err)
		}
		got = map[string]string{}
		for _, r := range rows[len(rows)-sourceRows:] {
			if r[1] != "source" {
				t.Errorf("cases CSV row %q is not the source's", r)
			}
			got[r[2]] = r[5]
		}
		if want := map[string]string{"program": version, "model_file": "office frame.toml", "model_sha256": hash, "run_date": date}; !equalMaps(got, want) {
			t.Errorf("cases CSV source rows %v, want %v", got, want)
		}
		// The page's header: each field in a row of its own.
		header := string(page[:bytes.Index(page, []byte("</header>"))])
		for _, f := range [][2]string{{"program", version}, {"model file", "office frame.toml"}, {"SHA-256", hash}, {"run date", date},
			{"project", "Block B &lt;east&gt;"}, {"job number", "J-2041"}, {"engineer", "A. Engineer"}, {"checker", "B. Checker"}} {
			if want := "<tr><th>" + f[0] + "</th><td>" + f[1] + "</td></tr>"; !strings.Contains(header, want) {
				t.Errorf("the report's header lacks %s", want)
			}
		}
	}
	t.Run("--date", func(t *testing.T) {
		js, cs, cases, page := run(t, "--date", "2026-03-04")
		check(t, js, cs, cases, page, "2026-03-04T00:00:00Z")
		js2, cs2, cases2, page2 := run(t, "--date", "2026-03-04T00:00:00Z")
		if !bytes.Equal(js, js2) || !bytes.Equal(cs, cs2) || !bytes.Equal(cases, cases2) || !bytes.Equal(page, page2) {
			t.Errorf("two runs with one date differ")
		}
	})
	t.Run("SOURCE_DATE_EPOCH", func(t *testing.T) {
		t.Setenv("SOURCE_DATE_EPOCH", "1700000000") // 2023-11-14T22:13:20Z
		js, cs, cases, page := run(t)
		check(t, js, cs, cases, page, "2023-11-14T22:13:20Z")
	})
	t.Run("a date that is not one", func(t *testing.T) {
		code, _, stderr := exec("run", "--quiet", "--json", filepath.Join(t.TempDir(), "x.json"), "--date", "4 March", model)
		if code != 2 || !strings.Contains(stderr, `--date "4 March"`) {
			t.Errorf("exit %d, stderr %q", code, stderr)
		}
		t.Setenv("SOURCE_DATE_EPOCH", "yesterday")
		code, _, stderr = exec("run", "--quiet", "--json", filepath.Join(t.TempDir(), "x.json"), model)
		if code != 1 || !strings.Contains(stderr, `SOURCE_DATE_EPOCH="yesterday"`) {
			t.Errorf("exit %d, stderr %q", code, stderr)
		}
	})
	t.Run("demo", func(t *testing.T) {
		// The demonstration's file is its built-in model.
		sum := sha256.Sum256(demoModel)
		code, out, stderr := exec("demo", "--json", "-")
		if code != 0 || !strings.Contains(out, `"model_file": "demo.toml", "sha256": "`+hex.EncodeToString(sum[:])+`"`) {
			t.Errorf("exit %d, stderr %q; the JSON lacks the demo's name and SHA-256", code, stderr)
		}
	})
}

func equalMaps(a, b map[string]string) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if b[k] != v {
			return false
		}
	}
	return true
}

// TestUsageNamesEveryFlag: the usage line of every command, which 'govern
// help NAME' prints, names every flag the command accepts, and only those;
// the flag list below it is the flag set's own.
func TestUsageNamesEveryFlag(t *testing.T) {
	flagRe := regexp.MustCompile(`--([a-z-]+)`)
	for _, c := range commands {
		t.Run(c.name, func(t *testing.T) {
			fs := flag.NewFlagSet(c.name, flag.ContinueOnError)
			c.setup(fs)
			code, help, _ := exec("help", c.name)
			if code != 0 {
				t.Fatalf("help: exit %d", code)
			}
			usage := strings.SplitN(help, "\n", 2)[0]
			named := map[string]bool{}
			for _, m := range flagRe.FindAllStringSubmatch(usage, -1) {
				named[m[1]] = true
				if fs.Lookup(m[1]) == nil {
					t.Errorf("the usage names --%s, which %s does not accept", m[1], c.name)
				}
			}
			fs.VisitAll(func(f *flag.Flag) {
				if !named[f.Name] {
					t.Errorf("%q does not name --%s", usage, f.Name)
				}
				if !strings.Contains(help, "\n  -"+f.Name) {
					t.Errorf("the help's flag list lacks -%s", f.Name)
				}
			})
		})
	}
}

// TestDemoTakesRunsFlags: demo accepts every flag of run and does what run
// does with it: --compare-patterns lists the comparison, not envelopes.
func TestDemoTakesRunsFlags(t *testing.T) {
	code, demo, stderr := exec("demo", "--compare-patterns")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	path := writeDemo(t)
	_, run, _ := exec("run", "--compare-patterns", path)
	if demo != run {
		t.Errorf("demo --compare-patterns differs from run --compare-patterns on the same model")
	}
}
