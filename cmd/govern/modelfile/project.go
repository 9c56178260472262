package modelfile

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
)

// Project is the optional [project] table of a model file: what the
// calculation is for and who made and checked it. Every field is text, ""
// when not given; the report shows them in its header.
type Project struct {
	Name     string // name: the project
	Number   string // number: the job number
	Engineer string // engineer: who made the model
	Checker  string // checker: who checks it
}

// EnteredLoad is one load of a case as the model file gives it: a
// [[case.load]] table, or a case's self_weight = true, with the line it is
// on and its keys and values as written ("type = \"area\", on = [\"roof\"],
// q = 5.5"). The loads it became are the case's member loads
// FirstMember to FirstMember+Members-1, its node loads and its support
// displacements likewise (a selector of several members gives several).
type EnteredLoad struct {
	Line int
	Text string

	FirstMember, Members             int
	FirstNode, Nodes                 int
	FirstDisplacement, Displacements int
}

// entryText writes the keys and values of a table as TOML would: type
// and on first, then the rest by name.
func entryText(m map[string]any) string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	rank := func(k string) int {
		switch k {
		case "type":
			return 0
		case "on", "node":
			return 1
		}
		return 2
	}
	slices.SortFunc(keys, func(a, b string) int {
		if ra, rb := rank(a), rank(b); ra != rb {
			return ra - rb
		}
		return strings.Compare(a, b)
	})
	parts := make([]string, len(keys))
	for i, k := range keys {
		parts[i] = k + " = " + valueText(m[k])
	}
	return strings.Join(parts, ", ")
}

// valueText writes a decoded TOML value as it would be written.
func valueText(v any) string {
	switch x := v.(type) {
	case string:
		return strconv.Quote(x)
	case float64:
		return strconv.FormatFloat(x, 'g', -1, 64)
	case int64:
		return strconv.FormatInt(x, 10)
	case bool:
		return strconv.FormatBool(x)
	case []any:
		parts := make([]string, len(x))
		for i, e := range x {
			parts[i] = valueText(e)
		}
		return "[" + strings.Join(parts, ", ") + "]"
	case []map[string]any:
		parts := make([]string, len(x))
		for i, e := range x {
			parts[i] = "{" + entryText(e) + "}"
		}
		return "[" + strings.Join(parts, ", ") + "]"
	case map[string]any:
		return "{" + entryText(x) + "}"
	}
	return fmt.Sprint(v)
}
