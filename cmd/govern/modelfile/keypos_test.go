package modelfile

import (
	"strings"
	"testing"

	"github.com/BurntSushi/toml"
)

// positionsOf decodes src and returns its key positions, failing the test
// when the lexer does not find the decoder's keys.
func positionsOf(t *testing.T, src string) *keyPositions {
	t.Helper()
	var raw map[string]any
	md, err := toml.Decode(src, &raw)
	if err != nil {
		t.Fatalf("decode: %v", err)
	}
	kp := newKeyPositions(src, md.Keys())
	if !kp.agrees {
		t.Fatalf("the lexer's keys differ from the decoder's %v", md.Keys())
	}
	return kp
}

// TestKeyPositions: each key is found at the line where it is written,
// whatever lies in strings and comments before it; the expected lines are
// counted by hand in each document.
func TestKeyPositions(t *testing.T) {
	var root place
	nodes := func(i int) *place { p := root.elemPlace("node", i); return &p }
	for _, tc := range []struct {
		name string
		src  string
		at   func() (*place, string)
		want int
	}{
		{"a table header inside a multi-line string is text",
			"title = \"\"\"\nFrame\n[[node]]\nx = 1\n\"\"\"\n[[node]]\nname = \"a\"\n[[node]]\nname = \"b\"\ny = 2\n",
			func() (*place, string) { return nodes(1), "y" }, 10},
		{"the same in a literal multi-line string, ending in quotes",
			"title = '''\n[[node]]\ny = 1\n'''''\n[[node]]\ny = 7\n",
			func() (*place, string) { return nodes(0), "y" }, 6},
		{"escaped quotes and a line-ending backslash in a basic multi-line string",
			"title = \"\"\"a \\\"\"\" [[node]]\\\n  y = 3 \"\"\"\n[[node]]\ny = 7\n",
			func() (*place, string) { return nodes(0), "y" }, 4},
		{"'=', '#' and brackets inside strings and comments",
			"a = \"x = [1] # [[node]]\" # y = 2\n# [[node]]\nb = 'c = \"d\"'\n[[node]]\ny = 1\n",
			func() (*place, string) { return nodes(0), "y" }, 5},
		{"a missing key falls back to its table's header",
			"[[node]]\nname = \"a\"\n\n[[node]]\nname = \"b\"\n",
			func() (*place, string) { return nodes(1), "x" }, 4},
		{"an element of an array of tables nested in another",
			"[[case]]\nname = \"D\"\n[[case.load]]\nw = 1\n[[case]]\nname = \"L\"\n[[case.load]]\nw = 2\n[[case.load]]\nw = 3\n",
			func() (*place, string) {
				c := root.elemPlace("case", 1)
				l := c.elemPlace("load", 1)
				return &l, "w"
			}, 10},
		{"a key of an inline table",
			"[[combination]]\nname = \"x\"\nfactors = {\n  D = 1.2,\n  L = 1.6 }\n",
			func() (*place, string) {
				c := root.elemPlace("combination", 0)
				f := c.subPlace("factors")
				return &f, "L"
			}, 5},
		{"an inline table in an array value",
			"[[case]]\nname = \"D\"\nload = [ { type = \"udl\" },\n  # a comment\n  { type = \"point\",\n    P = 2 } ]\n",
			func() (*place, string) {
				c := root.elemPlace("case", 0)
				l := c.elemPlace("load", 1)
				return &l, "P"
			}, 6},
		{"a table made by dotted keys",
			"title = \"t\"\ngrid.spacing = 6\ngrid.bays = [6.0,\n  7.2]\n",
			func() (*place, string) { g := root.subPlace("grid"); return &g, "bays" }, 3},
		{"a table defined after its sub-table",
			"[a.b]\nc = 1\n[a]\nd = 2\n",
			func() (*place, string) { a := root.subPlace("a"); return &a, "" }, 3},
		{"quoted keys with escapes",
			"\"x\\u0079\" = 1\n'lit.eral' = 2\n\"z\" = 3\n",
			func() (*place, string) { return &root, "lit.eral" }, 2},
		{"a table header at the top level is found by its name",
			"[analysis]\nstations = 3\n[units]\nforce = \"N\"\n",
			func() (*place, string) { return &root, "units" }, 3},
		{"CRLF line ends and a byte order mark",
			"\xef\xbb\xbftitle = \"a\"\r\n[[node]]\r\ny = 1\r\n",
			func() (*place, string) { return nodes(0), "y" }, 3},
		{"a date-time with a space and a comment after it",
			"when = 1979-05-27 07:32:00Z # [[node]]\n[[node]]\ny = 1\n",
			func() (*place, string) { return nodes(0), "y" }, 3},
		{"nested arrays over several lines",
			"a = [\n  [1, 2], # ]\n  [\"]\", 4],\n]\n[[node]]\ny = 1\n",
			func() (*place, string) { return nodes(0), "y" }, 6},
		{"an element past the end falls back to the top level",
			"[[node]]\ny = 1\n",
			func() (*place, string) { return nodes(3), "y" }, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			kp := positionsOf(t, tc.src)
			p, key := tc.at()
			if got := kp.line(p, key); got != tc.want {
				t.Errorf("line %d, want %d", got, tc.want)
			}
		})
	}
}

// TestKeyPositionsUnknownWhenTheDecoderDisagrees: positions are given only
// when the lexer found exactly the keys the decoder read.
func TestKeyPositionsUnknownWhenTheDecoderDisagrees(t *testing.T) {
	src := "[[node]]\nname = \"a\"\n"
	for _, keys := range [][]toml.Key{
		{{"node"}},                             // one key short
		{{"node"}, {"node", "nam"}},            // a different key
		{{"node"}, {"node", "name"}, {"more"}}, // one key more
	} {
		kp := newKeyPositions(src, keys)
		n := (&place{}).elemPlace("node", 0)
		if got := kp.line(&n, "name"); got != 0 {
			t.Errorf("keys %v: line %d, want 0 (unknown)", keys, got)
		}
	}
}

// TestKeyPositionsAgreeWithTheDecoder: on every document of the test
// suite and of testdata, the lexer finds the decoder's keys.
func TestKeyPositionsAgreeWithTheDecoder(t *testing.T) {
	for name, src := range map[string]string{"base": base, "grid": gridModel, "portal": portal} {
		t.Run(name, func(t *testing.T) { positionsOf(t, src) })
	}
	for _, p := range seedFiles(t) {
		src := readSeed(t, p)
		if strings.Contains(p, "syntax") {
			continue // not a document
		}
		t.Run(p, func(t *testing.T) { positionsOf(t, src) })
	}
}

// keySnippets are pieces of TOML with the constructs the key lexer must
// understand; FuzzKeyPositions starts from them and their joins.
var keySnippets = []string{
	"a = 1\n",
	"title = \"\"\"\n[[node]]\nx = 1\n\"\"\"\n",
	"t = '''\n[grid]\n'''\n",
	"s = \"\\\"[x]\\\" = \\\\\" # c = 1\n",
	"\"q.k\" = 'v'\n",
	"'lit' = \"\"\"a\\\n  b\"\"\"\n",
	"d.e.f = true\n",
	"[tab]\nk = 1979-05-27 07:32:00Z\n",
	"[tab.sub]\nk = [1, [2, 3], # x\n  4,]\n",
	"[[arr]]\nk = { a = 1, b = { c = [\"]\", '}'] } }\n",
	"[[arr.sub]]\nk = [ { x = 1 }, { y = 2 } ]\n",
	"in = {\n  a = 1, # comment\n  b = 2,\n}\n",
	"x = \"\\u00e9\\U0001F600\\x41\\e\"\n",
	"\"\\u0061\" = 1\n",
	"k = ''''two quotes'''''\n",
	"k = \"\"\"\"one\"\"\"\"\n",
	"\xef\xbb\xbfk = 1\r\n[t]\r\nv = 2\r\n",
	"n = -inf\nm = nan\no = 0x_1\n",
	"[ spaced . \"table\" ]\n  key . part = 1\n",
}

func FuzzKeyPositions(f *testing.F) {
	for i, a := range keySnippets {
		f.Add(a)
		f.Add(a + keySnippets[(i+7)%len(keySnippets)])
	}
	f.Fuzz(func(t *testing.T, src string) {
		if _, _, msg, _ := guard(src); msg != "" {
			return // nested deeper than the reader lets the decoder see
		}
		var raw map[string]any
		md, err := toml.Decode(src, &raw)
		if err != nil {
			return
		}
		if !newKeyPositions(src, md.Keys()).agrees {
			t.Fatalf("the key lexer does not find the decoder's keys %q", md.Keys())
		}
	})
}
