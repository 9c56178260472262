package modelfile

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// gridNote is the message that a [grid] at the top of the file is not
// generated.
const gridNote = "m.toml:1: [grid]: no frame is generated until the problems in [grid] are corrected; until then, what refers to its nodes, members, levels and lines is not checked"

// edits applies old → new replacements, in pairs, to base.
func edits(t *testing.T, pairs ...string) string {
	t.Helper()
	src := base
	for i := 0; i+1 < len(pairs); i += 2 {
		if !strings.Contains(src, pairs[i]) {
			t.Fatalf("edit %q not applied", pairs[i])
		}
		src = strings.Replace(src, pairs[i], pairs[i+1], 1)
	}
	return src
}

func TestSoundModelReads(t *testing.T) {
	if _, err := Read("m.toml", []byte(base)); err != nil {
		t.Fatal(err)
	}
}

// TestReadBadInput covers, one by one, the bad inputs of the reading and
// validation rules (docs/errors.md): each gives exactly the message shown,
// with its line (and column for syntax), and wraps the sentinel named.
func TestReadBadInput(t *testing.T) {
	for _, tc := range []struct {
		name     string
		edit     []string // old, new, old, new, …
		src      string   // the whole file, when edit is nil
		want     string
		sentinel error
	}{
		// Syntax: file, line, column, the line and a marker under the column.
		{name: "syntax: value missing", edit: []string{"x = 5", "x = "},
			want: "m.toml:13:5: expected value but found '\\n' instead\n    x = \n        ^", sentinel: ErrSyntax},
		{name: "syntax: column counts characters and the marker keeps tabs", src: "title = \"Träger\"\n\tx = \"Stütze\n",
			want: "m.toml:2:13: strings cannot contain newlines\n    \tx = \"Stütze\n    \t           ^", sentinel: ErrSyntax},
		{name: "syntax: CRLF line ends", src: "title = \"a\"\r\nx = [1,\r\n",
			want: "m.toml:2:8: unexpected EOF; expected value\n    x = [1,\n           ^", sentinel: ErrSyntax},
		{name: "syntax: a key given twice", edit: []string{"y = 0\nsupport = \"fixed\"\n[[member]]", "y = 0\ny = 1\n[[member]]"},
			want: "m.toml:15:1: Key 'node.y' has already been defined.\n    y = 1\n    ^", sentinel: ErrSyntax},
		{name: "syntax: control characters are shown as '?'", src: "title = \"a\x01b\nx = 1\n",
			want: "m.toml:1:10: TOML files cannot contain control characters: '0x01'\n    title = \"a?b\n             ^", sentinel: ErrSyntax},
		{name: "syntax: nesting deeper than the format allows", src: "a = " + strings.Repeat("{b=", 40) + "1" + strings.Repeat("}", 40) + "\n",
			// The 17th brace, at column 53; a long line is cut around it.
			want: "m.toml:1:53: arrays, inline tables or table names nested deeper than the format allows\n    …= " + strings.Repeat("{b=", 32) + "{b…\n    " + strings.Repeat(" ", 51) + "^", sentinel: ErrSyntax},
		{name: "syntax: dotted key of too many parts", src: "a" + strings.Repeat(" . a", 16) + " = 1\n",
			want: "m.toml:1:63: a dotted key or table name of more parts than the format allows\n    a . a . a . a . a . a . a . a . a . a . a . a . a . a . a . a . a = 1\n                                                                  ^", sentinel: ErrSyntax},

		// Keys the format does not know, with the table they sit in.
		{name: "unknown key in a load, with a likely misspelling", edit: []string{"  at = 1", "  at = 1\n  dirction = \"x\""},
			want: `m.toml:28: case "G", load 1: unknown key "dirction" (did you mean "direction"?)`, sentinel: ErrUnknownKey},
		{name: "unknown key with nothing close", edit: []string{"I = 1e-4", "I = 1e-4\ncolour = \"red\""},
			want: `m.toml:6: section "S": unknown key "colour"`, sentinel: ErrUnknownKey},
		{name: "unknown table at the top level", edit: []string{"[[section]]", "[analysys]\nstations = 3\n[[section]]"},
			want: `m.toml:1: unknown key "analysys" (did you mean "analysis"?) at the top level`, sentinel: ErrUnknownKey},
		{name: "unknown array of tables at the top level", edit: []string{"[[combination]]", "[[combinaton]]"},
			want: "m.toml:28: unknown key \"combinaton\" (did you mean \"combination\"?) at the top level", sentinel: ErrUnknownKey},

		// Types: the key and the type expected.
		{name: "number given as a string without a unit", edit: []string{"E = 200e6", `E = "200e6"`},
			want: `m.toml:3: section "S": E = "200e6": "200e6" has no unit: write the number without quotes for the model's own units, or give a unit, such as "200e6 MPa"`, sentinel: ErrValue},
		{name: "a boolean where a number with a unit is due", edit: []string{"E = 200e6", `E = true`},
			want: `m.toml:3: section "S": E must be a number, or a string of a number and a unit such as "12 kN", not a boolean`, sentinel: ErrType},
		{name: "integer expected", edit: []string{"[[section]]", "[analysis]\nstations = 5.5\n[[section]]"},
			want: `m.toml:2: [analysis]: stations must be an integer, not a number`, sentinel: ErrType},
		{name: "boolean expected", edit: []string{`kind = "dead"`, "kind = \"dead\"\nself_weight = \"yes\""},
			want: `m.toml:23: case "G": self_weight must be true or false, not a string`, sentinel: ErrType},
		{name: "depth given as a word", edit: []string{"I = 1e-4", "I = 1e-4\ndepth = \"deep\""},
			want: `m.toml:6: section "S": depth = "deep": "deep" is not a number followed by a unit, such as "12 m"`, sentinel: ErrValue},
		{name: "service given as a number", edit: []string{"factors = { G = 1.4 }", "factors = { G = 1.4 }\nservice = 1"},
			want: `m.toml:31: combination "1.4G": service must be true or false, not an integer`, sentinel: ErrType},
		{name: "a node named by a number is reported once", edit: []string{`start = "a"`, `start = 1`},
			want: `m.toml:17: member 1: start must be a string, not an integer`, sentinel: ErrType},
		{name: "string or array expected for a selector", edit: []string{`on = "a-b"`, `on = 3`},
			want: `m.toml:25: case "G", load 1: on must be a string or an array of strings, not an integer`, sentinel: ErrType},
		{name: "array of tables expected, with its header", edit: []string{"[[combination]]", "[[case]]\nname = \"Q\"\nkind = \"live\"\nload = 3\n[[combination]]"},
			want: `m.toml:31: case "Q": load must be an array of tables ([[case.load]]), not an integer`, sentinel: ErrType},
		{name: "factor of the wrong type, at its line", edit: []string{"factors = { G = 1.4 }", "\nfactors = { G = \"1.4\" }"},
			want: `m.toml:31: combination "1.4G": G must be a number, not a string`, sentinel: ErrType},

		// Values with a unit, and [units].
		{name: "an unknown unit, with the one meant", edit: []string{"E = 200e6", `E = "29000 kis"`},
			want: `m.toml:3: section "S": E = "29000 kis": "kis" is not a unit govern knows (did you mean "ksi"?)`, sentinel: ErrValue},
		{name: "a unit of the wrong dimension", edit: []string{"  P = 2", `  P = "2 kN/m"`},
			want: `m.toml:26: case "G", load 1: P = "2 kN/m": kN/m is a force per length, where a force is due (such as kN or kip)`, sentinel: ErrValue},
		{name: "a length where a force per length is due", edit: []string{"type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"udl\"\n  on = \"a-b\"\n  w = \"2.4 ft\""},
			want: `m.toml:26: case "G", load 1: w = "2.4 ft": ft is a length, where a force per length is due (such as kN/m or kip/ft)`, sentinel: ErrValue},
		{name: "a unit that cannot be read", edit: []string{"x = 5\n", "x = \"5 m m\"\n"},
			want: `m.toml:13: node "b": x = "5 m m": in "m m", " " cannot follow m; join symbols with * or · (such as kN*m)`, sentinel: ErrValue},
		{name: "an unknown force unit in [units]", edit: []string{"[[section]]", "[units]\nforce = \"tonf\"\n[[section]]"},
			want: `m.toml:2: [units]: force = "tonf": "tonf" is not a unit govern knows`, sentinel: ErrValue},
		{name: "a length given as the force unit, and no value with a unit checked after it", edit: []string{"[[section]]", "[units]\nforce = \"m\"\n[[section]]", "E = 200e6", `E = "200 GPa"`},
			want: `m.toml:2: [units]: force = "m": m is a length, not a force (such as kN or kip)`, sentinel: ErrValue},
		{name: "a misspelt length unit", edit: []string{"[[section]]", "[units]\nlength = \"MM\"\n[[section]]"},
			want: `m.toml:2: [units]: length = "MM": "MM" is not a unit govern knows (did you mean "mm"?)`, sentinel: ErrValue},
		{name: "a rotation as the temperature unit", edit: []string{"[[section]]", "[units]\ntemperature = \"rad\"\n[[section]]"},
			want: `m.toml:2: [units]: temperature = "rad": rad is a rotation, not a temperature difference (such as K, °C or °F)`, sentinel: ErrValue},
		{name: "an output moment unit that is a force", edit: []string{"[[section]]", "[units]\nmoment = \"kip\"\n[[section]]"},
			want: `m.toml:2: [units]: moment = "kip": kip is a force, not a moment (force × length) (such as kN·m or kip·ft)`, sentinel: ErrValue},
		{name: "an output deflection unit that is a moment", edit: []string{"[[section]]", "[units]\ndeflection = \"kN*m\"\n[[section]]"},
			want: `m.toml:2: [units]: deflection = "kN*m": kN·m is a moment (force × length), not a length (such as m, mm or ft)`, sentinel: ErrValue},
		{name: "a unit given as a number", edit: []string{"[[section]]", "[units]\nforce = 1000\n[[section]]"},
			want: `m.toml:2: [units]: force must be a string, not an integer`, sentinel: ErrType},

		// References.
		{name: "unknown node", edit: []string{`end = "b"`, `end = "c"`},
			want: `m.toml:18: member 1: end = "c": no such node`, sentinel: ErrReference},
		{name: "unknown section, with a likely misspelling", edit: []string{"[[section]]\nname = \"S\"", "[[section]]\nname = \"IPE300\"", `section = "S"`, `section = "IPE 300"`},
			want: `m.toml:19: member 1: section = "IPE 300": no such section (did you mean "IPE300"?)`, sentinel: ErrReference},
		{name: "unknown case in a combination", edit: []string{"{ G = 1.4 }", "{ G = 1.2, Q = 1.6 }"},
			want: `m.toml:30: combination "1.4G": factors: no case named "Q"`, sentinel: ErrReference},
		{name: "unknown member in a selector", edit: []string{`on = "a-b"`, `on = "a_b"`},
			want: `m.toml:25: case "G", load 1: selector "a_b": no member of that name, and not one of "level N", "roof", "storey N", "line A", "all beams", "all columns", a range such as "level 1-3", or several joined by " & " (did you mean "a-b"?)`, sentinel: ErrReference},
		{name: "unknown node in a node load", edit: []string{"type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"node\"\n  node = \"B\"\n  fy = -2"},
			want: `m.toml:25: case "G", load 1: node = "B": no such node (did you mean "b"?)`, sentinel: ErrReference},
		{name: "selector that matches nothing", edit: []string{`on = "a-b"`, `on = "all columns"`},
			want: `m.toml:25: case "G", load 1: selector "all columns" matches no member`, sentinel: ErrReference},
		{name: "roof of a model without nodes (found by fuzzing)", src: "[[case]]\nname = \"G\"\nkind = \"dead\"\n[[case.load]]\ntype = \"udl\"\non = [\"roof\"]\nw = 1\n",
			want: "m.toml: the model has no nodes: give a [grid] or [[node]] tables\nm.toml: the model has no members: give a [grid] or [[member]] tables\nm.toml:6: case \"G\", load 1: selector \"roof\": the model has no nodes, so no levels", sentinel: ErrReference},

		// Empty load cases.
		{name: "a case with no loads", edit: []string{"[[combination]]", "[[case]]\nname = \"Q\"\nkind = \"live\"\n[[combination]]"},
			want: `m.toml:28: case "Q": it has no loads: give it a [[case.load]] (or self_weight = true), or remove the case`, sentinel: ErrMissing},
		{name: "a case whose every load is zero", edit: []string{"P = 2", "P = 0"},
			want: `m.toml:20: case "G": every load of it is zero: give it a [[case.load]] (or self_weight = true), or remove the case`, sentinel: ErrMissing},

		// Duplicates.
		{name: "duplicate section", edit: []string{"[[node]]\nname = \"a\"", "[[section]]\nname = \"S\"\nE = 1\nA = 1\nI = 1\n[[node]]\nname = \"a\""},
			want: `m.toml:7: section "S": section "S" is defined twice`, sentinel: ErrDuplicate},
		{name: "duplicate member", edit: []string{"[[case]]", "[[member]]\nname = \"a-b\"\nstart = \"b\"\nend = \"a\"\nsection = \"S\"\n[[case]]"},
			want: `m.toml:21: member "a-b": member "a-b" is defined twice`, sentinel: ErrDuplicate},
		{name: "duplicate case", edit: []string{"[[combination]]", "[[case]]\nname = \"G\"\nkind = \"live\"\n[[combination]]"},
			want: `m.toml:29: case "G": case "G" is defined twice`, sentinel: ErrDuplicate},
		{name: "duplicate combination", edit: []string{"factors = { G = 1.4 }", "factors = { G = 1.4 }\n[[combination]]\nname = \"1.4G\"\nfactors = { G = 1.2 }"},
			want: `m.toml:32: combination "1.4G": combination "1.4G" is defined twice`, sentinel: ErrDuplicate},
		{name: "two members joining the same nodes", edit: []string{"[[case]]", "[[member]]\nname = \"twin\"\nstart = \"b\"\nend = \"a\"\nsection = \"S\"\n[[case]]"},
			want: `m.toml:23: member "twin": member "twin" joins the same nodes as member "a-b"`, sentinel: ErrDuplicate},
		{name: "two nodes at one position", edit: []string{"[[member]]", "[[node]]\nname = \"c\"\nx = 5.0\ny = 0\n[[member]]\nstart = \"a\"\nend = \"c\"\nsection = \"S\"\n[[member]]"},
			want: `m.toml:18: node "c": node "c" is at the same position (5, 0) as node "b"`, sentinel: ErrDuplicate},

		// Values.
		{name: "zero-length member", edit: []string{"x = 5\n", "x = 0\n"},
			want: `m.toml:18: member 1: member "a-b" has zero length`, sentinel: ErrValue},
		{name: "negative E", edit: []string{"E = 200e6", "E = -200e6"},
			want: `m.toml:3: section "S": E = -2e+08: must be greater than zero`, sentinel: ErrValue},
		{name: "zero A", edit: []string{"A = 0.01", "A = 0"},
			want: `m.toml:4: section "S": A = 0: must be greater than zero`, sentinel: ErrValue},
		{name: "zero I", edit: []string{"I = 1e-4", "I = 0.0"},
			want: `m.toml:5: section "S": I = 0: must be greater than zero`, sentinel: ErrValue},
		{name: "zero depth", edit: []string{"I = 1e-4", "I = 1e-4\ndepth = 0"},
			want: `m.toml:6: section "S": depth = 0: must be greater than zero`, sentinel: ErrValue},
		{name: "infinite depth", edit: []string{"I = 1e-4", "I = 1e-4\ndepth = inf"},
			want: `m.toml:6: section "S": depth must be a finite number, not +Inf`, sentinel: ErrValue},
		{name: "NaN", edit: []string{"E = 200e6", "E = nan"},
			want: `m.toml:3: section "S": E must be a finite number, not NaN`, sentinel: ErrValue},
		{name: "infinite coordinate", edit: []string{"x = 5", "x = -inf"},
			want: `m.toml:13: node "b": x must be a finite number, not -Inf`, sentinel: ErrValue},
		{name: "infinite load", edit: []string{"P = 2", "P = +inf"},
			want: `m.toml:26: case "G", load 1: P must be a finite number, not +Inf`, sentinel: ErrValue},
		{name: "NaN in an array", edit: []string{"[[section]]", "[grid]\nbays = [6.0, nan]\nstoreys = [3.0]\ncolumn = \"S\"\nbeam = \"S\"\n[[section]]"},
			want: gridNote + "\nm.toml:2: [grid]: bays[2] must be a finite number, not NaN", sentinel: ErrValue},
		{name: "NaN factor", edit: []string{"{ G = 1.4 }", "{ G = nan }"},
			want: `m.toml:30: combination "1.4G": G must be a finite number, not NaN`, sentinel: ErrValue},
		{name: "point load outside its member", edit: []string{"at = 1", "at = 7.5"},
			want: `m.toml:27: case "G", load 1: member "a-b": at = 7.5 is outside the member (length 5)`, sentinel: ErrValue},
		{name: "partial load outside its member", edit: []string{"type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"udl\"\n  on = \"a-b\"\n  w = 2\n  from = 2\n  to = 6"},
			want: `m.toml:27: case "G", load 1: member "a-b": from = 2, to = 6 is not a part of the member (length 5)`, sentinel: ErrValue},
		{name: "partial load running backwards", edit: []string{"type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"udl\"\n  on = \"a-b\"\n  w = 2\n  from = 3\n  to = 1"},
			want: `m.toml:27: case "G", load 1: member "a-b": from = 3, to = 1 is not a part of the member (length 5)`, sentinel: ErrValue},
		{name: "combination with no factors", edit: []string{"{ G = 1.4 }", "{}"},
			want: `m.toml:30: combination "1.4G": factors is empty: a combination needs at least one case`, sentinel: ErrValue},
		{name: "grid with no bays", edit: []string{"[[section]]", "[grid]\nbays = []\nstoreys = [3.0]\ncolumn = \"S\"\nbeam = \"S\"\n[[section]]"},
			want: gridNote + "\nm.toml:2: [grid]: bays is empty: give at least one bay width", sentinel: ErrValue},
		{name: "grid with no storeys", edit: []string{"[[section]]", "[grid]\nbays = [6.0]\nstoreys = []\ncolumn = \"S\"\nbeam = \"S\"\n[[section]]"},
			want: gridNote + "\nm.toml:3: [grid]: storeys is empty: give at least one storey height", sentinel: ErrValue},
		{name: "node joined to no member", edit: []string{"[[member]]", "[[node]]\nname = \"c\"\nx = 9\ny = 0\n[[member]]"},
			want: `m.toml:17: node "c": node "c" is not joined to any member`, sentinel: ErrValue},

		// Names that read as selectors: a member so named
		// would capture the selector.
		{name: "member named like a selector", edit: []string{"[[case]]", "[[node]]\nname = \"c\"\nx = 9\ny = 0\n[[member]]\nname = \"all beams\"\nstart = \"b\"\nend = \"c\"\nsection = \"S\"\n[[case]]"},
			want: `m.toml:25: member "all beams": the name "all beams" reads as a member selector ("level N", "roof", "storey N", "line A", "all beams", "all columns", a range such as "level 1-3", or several joined by " & "): choose another name`, sentinel: ErrValue},
		{name: "member named like a level", edit: []string{"[[case]]", "[[node]]\nname = \"c\"\nx = 9\ny = 0\n[[member]]\nname = \"level 0\"\nstart = \"b\"\nend = \"c\"\nsection = \"S\"\n[[case]]"},
			want: `m.toml:25: member "level 0": the name "level 0" reads as a member selector ("level N", "roof", "storey N", "line A", "all beams", "all columns", a range such as "level 1-3", or several joined by " & "): choose another name`, sentinel: ErrValue},
		{name: "member named roof", edit: []string{"[[case]]", "[[node]]\nname = \"c\"\nx = 9\ny = 0\n[[member]]\nname = \"roof\"\nstart = \"b\"\nend = \"c\"\nsection = \"S\"\n[[case]]"},
			want: `m.toml:25: member "roof": the name "roof" reads as a member selector ("level N", "roof", "storey N", "line A", "all beams", "all columns", a range such as "level 1-3", or several joined by " & "): choose another name`, sentinel: ErrValue},
		{name: "member whose default name reads as a line", edit: []string{"name = \"a\"", "name = \"line B\"", "start = \"a\"", "start = \"line B\"", `on = "a-b"`, `on = "all beams"`},
			want: `m.toml:16: member 1: the name "line B-b" reads as a member selector ("level N", "roof", "storey N", "line A", "all beams", "all columns", a range such as "level 1-3", or several joined by " & "): choose another name`, sentinel: ErrValue},

		// A member picked twice by one load: refused, naming the
		// member and both selectors.
		{name: "member picked by a name and a keyword selector", edit: []string{`on = "a-b"`, `on = ["a-b", "all beams"]`},
			want: `m.toml:25: case "G", load 1: on: "a-b" and "all beams" both pick member "a-b"; a load acts once on each member, so remove one of them`, sentinel: ErrDuplicate},
		{name: "the same selector twice", edit: []string{`on = "a-b"`, `on = ["a-b", "a-b"]`},
			want: `m.toml:25: case "G", load 1: on: "a-b" is given twice`, sentinel: ErrDuplicate},

		// A node on a member it is not joined to.
		{name: "node on a member's interior, not joined", edit: []string{"[[case]]", "[[node]]\nname = \"c\"\nx = 2.5\ny = 0\n[[node]]\nname = \"d\"\nx = 2.5\ny = 3\nsupport = \"fixed\"\n[[member]]\nstart = \"c\"\nend = \"d\"\nsection = \"S\"\n[[case]]"},
			want: `m.toml:16: member 1: node "c" lies on member "a-b", 2.5 from its start, but is not joined to it: split the member at the node, or, if the two cross without a connection, give the member passes = ["c"]`, sentinel: ErrValue},
		{name: "passes naming a node off the member", edit: []string{"section = \"S\"\n[[case]]", "section = \"S\"\npasses = \"b\"\n[[case]]"},
			want: `m.toml:20: member 1: passes: node "b" does not lie on member "a-b" between its ends`, sentinel: ErrValue},
		{name: "passes naming no node", edit: []string{"section = \"S\"\n[[case]]", "section = \"S\"\npasses = [\"B\"]\n[[case]]"},
			want: `m.toml:20: member 1: passes: no node named "B" (did you mean "b"?)`, sentinel: ErrReference},

		// Nodes within the tolerance of each other, whatever lies between
		// them in any one order.
		{name: "two nodes 1e-10 apart with a third between them in X", edit: []string{"[[case]]", "[[node]]\nname = \"c\"\nx = 5.0000000001\ny = 0\n[[node]]\nname = \"e\"\nx = 5.00000000005\ny = 7\n[[member]]\nstart = \"a\"\nend = \"c\"\nsection = \"S\"\n[[member]]\nstart = \"a\"\nend = \"e\"\nsection = \"S\"\n[[case]]"},
			want: `m.toml:22: node "c": node "c" is at the same position (5.0000000001, 0) as node "b"`, sentinel: ErrDuplicate},

		// Empty lists and names.
		{name: "on is empty", edit: []string{`on = "a-b"`, `on = []`},
			want: `m.toml:25: case "G", load 1: on is empty: name at least one member or selector`, sentinel: ErrValue},
		{name: "an empty selector", edit: []string{`on = "a-b"`, `on = ["a-b", ""]`},
			want: `m.toml:25: case "G", load 1: on: an empty selector`, sentinel: ErrValue},
		{name: "empty section name", edit: []string{"[[section]]\nname = \"S\"", "[[section]]\nname = \"\""},
			want: "m.toml:2: section 1: name is empty\nm.toml:19: member 1: section = \"S\": no such section", sentinel: ErrValue},
		{name: "empty node name", edit: []string{"name = \"a\"", "name = \"\""},
			want: "m.toml:7: node 1: name is empty\nm.toml:17: member 1: start = \"a\": no such node", sentinel: ErrValue},
		{name: "empty member name", edit: []string{"start = \"a\"", "name = \"\"\nstart = \"a\""},
			want: `m.toml:17: member 1: name is empty: give a name, or leave name out for "a-b"`, sentinel: ErrValue},
		{name: "empty case name", edit: []string{"name = \"G\"", "name = \"\"", "{ G = 1.4 }", "{ \"\" = 1.4 }"},
			want: `m.toml:21: case 1: name is empty`, sentinel: ErrValue},
		{name: "empty combination name", edit: []string{"name = \"1.4G\"", "name = \"\""},
			want: `m.toml:29: combination 1: name is empty`, sentinel: ErrValue},
		{name: "empty section reference", edit: []string{`section = "S"`, `section = ""`},
			want: `m.toml:19: member 1: section = "": no such section`, sentinel: ErrReference},

		// A misspelt kind gets a suggestion, and nothing that depends on the
		// kind is checked.
		{name: "kind in capitals, patterned", edit: []string{`kind = "dead"`, "kind = \"Live\"\npattern = true"},
			want: `m.toml:22: case "G": kind = "Live": must be one of "dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature" (did you mean "live"?)`, sentinel: ErrValue},
		{name: "kind misspelt, reversible", edit: []string{`kind = "dead"`, "kind = \"wnid\"\nreversible = true"},
			want: `m.toml:22: case "G": kind = "wnid": must be one of "dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature" (did you mean "wind"?)`, sentinel: ErrValue},

		// Positions come from the decoder's keys, not from lines that look
		// like table headers: the title's lines shift the rest by 5.
		{name: "a table header inside a multi-line title", edit: []string{"[[section]]", "title = \"\"\"\nFrame\n[[node]]\nx = 1\n\"\"\"\n[[section]]", "support = \"fixed\"\n[[member]]", "suport = \"fixed\"\n[[member]]"},
			want: `m.toml:20: node "b": unknown key "suport" (did you mean "support"?)`, sentinel: ErrUnknownKey},
		{name: "a table and a key inside a multi-line string", edit: []string{"[[section]]", "title = '''\n[[section]]\nE = 1\n'''\n[[section]]", "E = 200e6", "E = -1.0"},
			want: `m.toml:7: section "S": E = -1: must be greater than zero`, sentinel: ErrValue},

		// Missing pieces.
		{name: "empty model", src: "",
			want: `m.toml: the model is empty: give a [grid] or [[node]] and [[member]] tables, and [[case]] tables (see docs/model-format.md)`, sentinel: ErrMissing},
		{name: "model without load cases", edit: []string{"[[case]]\nname = \"G\"\nkind = \"dead\"\n  [[case.load]]\n  type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1\n[[combination]]\nname = \"1.4G\"\nfactors = { G = 1.4 }\n", ""},
			want: `m.toml: the model has no load cases: give at least one [[case]]`, sentinel: ErrMissing},
		{name: "required key missing", edit: []string{"  P = 2\n", ""},
			want: `m.toml:23: case "G", load 1: P is required`, sentinel: ErrMissing},

		// Limits.
		{name: "grid past a million degrees of freedom", edit: []string{"[[section]]", "[grid]\nbays = [" + strings.Repeat("1.0, ", 999) + "1.0]\nstoreys = [" + strings.Repeat("1.0, ", 399) + "1.0]\ncolumn = \"S\"\nbeam = \"S\"\n[[section]]"},
			want: "m.toml:1: [grid]: 1001 column lines × 401 levels make 401,401 nodes with 1,201,200 free degrees of freedom; the limit is 1,000,000\n" + gridNote, sentinel: ErrTooLarge},
		{name: "grid past 500,000 members", edit: []string{"[[section]]", "[grid]\nbays = [" + strings.Repeat("1.0, ", 998) + "1.0]\nstoreys = [" + strings.Repeat("1.0, ", 299) + "1.0]\ncolumn = \"S\"\nbeam = \"S\"\n[[section]]"},
			want: "m.toml:1: [grid]: 1000 column lines × 301 levels make 599,700 members, whose envelopes would hold at least 1,199,400 station values (two a member, its ends, the fewest there can be); the limit is 1,000,000 station values, which admits 500,000 members: use fewer bays or storeys\n" + gridNote, sentinel: ErrTooLarge},
		{name: "more entries than the limit", src: "x = [" + strings.Repeat("{},", MaxEntries/inlineEntries) + "{}]\n",
			want: "m.toml: the file has 6,000,004 entries (keys and tables, an inline table counting as 3); the limit is 6,000,000", sentinel: ErrTooLarge},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := tc.src
			if tc.edit != nil {
				src = edits(t, tc.edit...)
			}
			_, err := Read("m.toml", []byte(src))
			if err == nil {
				t.Fatal("no error")
			}
			if got := err.Error(); got != tc.want {
				t.Errorf("error\n got: %s\nwant: %s", got, tc.want)
			}
			if !errors.Is(err, tc.sentinel) {
				t.Errorf("error does not wrap %v", tc.sentinel)
			}
		})
	}
}

func TestMembersPastTheStationLimit(t *testing.T) {
	// A grid of 999 bays × 250 storeys has 499,750 members, within the
	// limit; a chain of 251 more members beside it passes it, which no
	// number of stations can help: the message asks for fewer members.
	var b strings.Builder
	fmt.Fprintf(&b, "[grid]\nbays = [%s1.0]\nstoreys = [%s1.0]\ncolumn = \"S\"\nbeam = \"S\"\n", strings.Repeat("1.0, ", 998), strings.Repeat("1.0, ", 249))
	b.WriteString("[[section]]\nname = \"S\"\nE = 200e6\nA = 0.01\nI = 1e-4\n")
	for i := range 251 {
		fmt.Fprintf(&b, "[[node]]\nname = \"x%d\"\nx = %d\ny = -1\n", i, i)
		from := fmt.Sprintf("x%d", i-1)
		if i == 0 {
			from = "A0"
		}
		fmt.Fprintf(&b, "[[member]]\nstart = %q\nend = \"x%d\"\nsection = \"S\"\n", from, i)
	}
	b.WriteString("[[case]]\nname = \"G\"\nkind = \"dead\"\n[[case.load]]\ntype = \"node\"\nnode = \"A1\"\nfx = 1.0\n")
	_, err := Read("m.toml", []byte(b.String()))
	want := "m.toml: the model has 500,001 members, whose envelopes would hold at least 1,000,002 station values (two a member, its ends, the fewest there can be); the limit is 1,000,000 station values, which admits 500,000 members: use fewer members"
	if err == nil || err.Error() != want {
		t.Fatalf("err = %v\nwant %s", err, want)
	}
	if !errors.Is(err, ErrTooLarge) {
		t.Errorf("error does not wrap ErrTooLarge")
	}
	if tooManyMembers(MaxStationValues/2, "the model has", "use fewer members") != nil {
		t.Errorf("refused %d members, which fit at two stations", MaxStationValues/2)
	}
}

func TestReadReportsProblemsInEverySectionAtOnce(t *testing.T) {
	src := edits(t,
		"[[section]]", "titel = \"x\"\n[units]\nforce = 1\n[analysis]\nstations = 0\n[[section]]",
		"E = 200e6", "E = -1.0",
		"support = \"fixed\"\n[[member]]", "suport = \"fixed\"\n[[member]]",
		`section = "S"`, `section = "T"`,
		"kind = \"dead\"", "kind = \"permanent\"",
		"at = 1", "at = 9",
		"{ G = 1.4 }", "{ Q = 1.4 }",
	)
	_, err := Read("m.toml", []byte(src))
	var es ErrorList
	if !errors.As(err, &es) {
		t.Fatalf("err = %v, want an ErrorList", err)
	}
	want := []string{
		`m.toml:1: unknown key "titel" (did you mean "title"?) at the top level`,
		`m.toml:3: [units]: force must be a string, not an integer`,
		`m.toml:5: [analysis]: stations = 0: need at least 2 (both ends of each member)`,
		`m.toml:8: section "S": E = -1: must be greater than zero`,
		`m.toml:20: node "b": unknown key "suport" (did you mean "support"?)`,
		`m.toml:24: member 1: section = "T": no such section`,
		`m.toml:27: case "G": kind = "permanent": must be one of "dead", "live", "roof-live", "snow", "rain", "wind", "seismic", "other", "settlement", "temperature"`,
		`m.toml:35: combination "1.4G": factors: no case named "Q"`,
	}
	if got := strings.Split(err.Error(), "\n"); strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("problems\n got: %s\nwant: %s", strings.Join(got, "\n      "), strings.Join(want, "\n      "))
	}
}

func TestReadListsAtMostMaxProblems(t *testing.T) {
	var b strings.Builder
	b.WriteString(base)
	const extra = MaxProblems + 25
	for i := range extra {
		fmt.Fprintf(&b, "[[node]]\nname = \"n%d\"\nx = %d\ny = 1\nsuport = \"free\"\n", i, i)
	}
	_, err := Read("m.toml", []byte(b.String()))
	var es ErrorList
	if !errors.As(err, &es) {
		t.Fatalf("err = %v", err)
	}
	if len(es) != MaxProblems+1 {
		t.Fatalf("%d problems listed, want %d and a count", len(es), MaxProblems)
	}
	// Each extra node has an unknown key and is joined to no member.
	want := fmt.Sprintf("m.toml: %d more problems not listed; correct these first", 2*extra-MaxProblems)
	if got := es[MaxProblems].Error(); got != want || !errors.Is(es[MaxProblems], ErrTooMany) {
		t.Errorf("last = %q, want %q", got, want)
	}
}

func TestMemberLoadBudget(t *testing.T) {
	r := &reader{doc: &doc{file: "m.toml", loc: &locator{kp: positionsOf(t, base)}}}
	tb := r.table(map[string]any{}, "case[0].load[0]", `case "G", load 1`)
	r.memberLoads = MaxMemberLoads - 2
	if !r.budget(tb, "on", 2) {
		t.Fatal("refused loads within the limit")
	}
	for range 2 {
		if r.budget(tb, "on", 1) {
			t.Fatal("accepted loads past the limit")
		}
	}
	if len(r.errs) != 1 {
		t.Fatalf("%d problems, want 1 (reported once): %v", len(r.errs), r.errs)
	}
	want := `m.toml:25: case "G", load 1: more than 5,000,000 member loads (each member a selector picks, and each member a self weight loads, counts as one); the limit is 5,000,000`
	if got := r.errs[0].Error(); got != want {
		t.Errorf("error\n got: %s\nwant: %s", got, want)
	}
}

// TestEveryValidateCheckIsMadeByTheReader: frame.Model.Validate runs only
// when the reader found nothing (docs/errors.md), so each of its checks
// must be made by the reader too, with a line. For each check of
// Validate, a file that fails it gets a problem from the reader with a
// line, and none in Validate's words (which come without one).
func TestEveryValidateCheckIsMadeByTheReader(t *testing.T) {
	for _, tc := range []struct {
		check string
		edit  []string
	}{
		{"duplicate node name", []string{"[[member]]", "[[node]]\nname = \"a\"\nx = 2\ny = 2\n[[member]]"}},
		{"node coordinates finite", []string{"y = 0\nsupport = \"fixed\"\n[[member]]", "y = nan\nsupport = \"fixed\"\n[[member]]"}},
		{"duplicate section name", []string{"[[node]]\nname = \"a\"", "[[section]]\nname = \"S\"\nE = 1\nA = 1\nI = 1\n[[node]]\nname = \"a\""}},
		{"E positive", []string{"E = 200e6", "E = 0"}},
		{"A finite", []string{"A = 0.01", "A = inf"}},
		{"I positive", []string{"I = 1e-4", "I = -1e-4"}},
		{"weight finite and not negative", []string{"I = 1e-4", "I = 1e-4\nweight = -1"}},
		{"depth finite and not negative", []string{"I = 1e-4", "I = 1e-4\ndepth = -0.3"}},
		{"duplicate member name", []string{"[[case]]", "[[member]]\nname = \"a-b\"\nstart = \"a\"\nend = \"b\"\nsection = \"S\"\n[[case]]"}},
		{"member length", []string{"x = 5\n", "x = 0\n"}},
		{"node joined to a member", []string{"[[member]]", "[[node]]\nname = \"c\"\nx = 9\ny = 9\n[[member]]"}},
		{"duplicate case name", []string{"[[combination]]", "[[case]]\nname = \"G\"\nkind = \"dead\"\n[[combination]]"}},
		{"point load on its member", []string{"at = 1", "at = -1"}},
		{"point load finite", []string{"P = 2", "P = nan"}},
		{"distributed load on its member", []string{"type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"udl\"\n  on = \"a-b\"\n  w = 2\n  to = 9"}},
		{"distributed load finite", []string{"type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"udl\"\n  on = \"a-b\"\n  w = inf"}},
		{"node load finite", []string{"type = \"point\"\n  on = \"a-b\"\n  P = 2\n  at = 1", "type = \"node\"\n  node = \"b\"\n  m = -inf"}},
	} {
		t.Run(tc.check, func(t *testing.T) {
			_, err := Read("m.toml", []byte(edits(t, tc.edit...)))
			var es ErrorList
			if !errors.As(err, &es) {
				t.Fatalf("err = %v, want problems", err)
			}
			for _, e := range es {
				if e.Pos.Line == 0 {
					t.Errorf("problem without a line: %v", e)
				}
			}
		})
	}
}

// TestReadRefusesALargeFile: a file past MaxFileSize is refused before it
// is looked at (the bytes of this one are never touched, so it costs no
// memory).
func TestReadRefusesALargeFile(t *testing.T) {
	_, err := Read("m.toml", make([]byte, MaxFileSize+1))
	want := fmt.Sprintf("m.toml: the file is %d bytes; the limit is %d (%d MiB)", MaxFileSize+1, MaxFileSize, MaxFileSize>>20)
	if err == nil || err.Error() != want || !errors.Is(err, ErrTooLarge) {
		t.Errorf("error\n got: %v\nwant: %s", err, want)
	}
}

// TestLimitsAreDocumented: docs/errors.md gives the limits of the reader
// as they are.
func TestLimitsAreDocumented(t *testing.T) {
	doc, err := os.ReadFile(filepath.Join("..", "..", "..", "docs", "errors.md"))
	if err != nil {
		t.Fatal(err)
	}
	for _, row := range []string{
		fmt.Sprintf("| model file | %d MiB |", MaxFileSize>>20),
		fmt.Sprintf("| entries of a model file: keys and table headers, an inline table counting as %d | %s |", inlineEntries, Thousands(MaxEntries)),
		fmt.Sprintf("| nesting of arrays and inline tables, parts of a dotted key | %d |", MaxNesting),
		fmt.Sprintf("| rule file named by `[combinations]` | %d MiB |", MaxRuleFileSize>>20),
	} {
		if !strings.Contains(string(doc), row) {
			t.Errorf("docs/errors.md has no row %q", row)
		}
	}
}
