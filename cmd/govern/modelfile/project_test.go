package modelfile

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"strings"
	"testing"
)

func TestProject(t *testing.T) {
	t.Run("fields read", func(t *testing.T) {
		src := "[project]\nname = \"Office, Block B\"\nnumber = \"J-2041\"\nengineer = \"A. Engineer\"\nchecker = \"B. Checker\"\n" + base
		job, err := Read("m.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		want := Project{Name: "Office, Block B", Number: "J-2041", Engineer: "A. Engineer", Checker: "B. Checker"}
		if job.Project != want {
			t.Errorf("project %+v, want %+v", job.Project, want)
		}
	})
	t.Run("optional", func(t *testing.T) {
		job, err := Read("m.toml", []byte(base))
		if err != nil {
			t.Fatal(err)
		}
		if job.Project != (Project{}) {
			t.Errorf("project %+v, want none", job.Project)
		}
	})
	for _, tc := range []struct{ name, src, want string }{
		{"a number where text is due", "[project]\nnumber = 2041\n", `m.toml:2: [project]: number must be a string`},
		{"an unknown key, with its line", "[project]\nname = \"x\"\nenginer = \"y\"\n", `m.toml:3: [project]: unknown key "enginer" (did you mean "engineer"?)`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Read("m.toml", []byte(tc.src+base))
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want %q", err, tc.want)
			}
			var l ErrorList
			if !errors.As(err, &l) {
				t.Errorf("error %T, want an ErrorList", err)
			}
		})
	}
}

func TestSHA256IsTheFiles(t *testing.T) {
	// FIPS 180-4 SHA-256, through crypto/sha256: the job names the bytes it
	// was read from.
	job, err := Read("m.toml", []byte(base))
	if err != nil {
		t.Fatal(err)
	}
	sum := sha256.Sum256([]byte(base))
	if want := hex.EncodeToString(sum[:]); job.SHA256 != want {
		t.Errorf("SHA-256 %s, want %s", job.SHA256, want)
	}
}

func TestEnteredLoads(t *testing.T) {
	// base's case G: one point load of 2 at 1 on a-b, line 23.
	job, err := Read("m.toml", []byte(base))
	if err != nil {
		t.Fatal(err)
	}
	if len(job.Entered) != 1 || len(job.Entered[0]) != 1 {
		t.Fatalf("entered %+v, want one load of one case", job.Entered)
	}
	e := job.Entered[0][0]
	if e.Line != 23 || e.Text != `type = "point", on = "a-b", P = 2, at = 1` || e.FirstMember != 0 || e.Members != 1 || e.Nodes != 0 {
		t.Errorf("entered %+v", e)
	}
}

func TestAllowableCombination(t *testing.T) {
	t.Run("read", func(t *testing.T) {
		job, err := Read("m.toml", []byte(base+"allowable = true\n"))
		if err != nil {
			t.Fatal(err)
		}
		if cb := job.Combinations[0]; !cb.Allowable || cb.Service {
			t.Errorf("combination %+v, want allowable", cb)
		}
	})
	t.Run("not with service", func(t *testing.T) {
		_, err := Read("m.toml", []byte(base+"allowable = true\nservice = true\n"))
		want := `m.toml:31: combination "1.4G": allowable = true with service = true`
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Errorf("error %v, want %q", err, want)
		}
	})
}
