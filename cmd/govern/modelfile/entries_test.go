package modelfile

import "testing"

// Entries counts as MaxEntries does: keys and table headers one each, an
// inline table three besides its keys, nothing in strings or comments;
// counted by hand.
func TestEntries(t *testing.T) {
	src := `title = "t"   # one; {a = 1} in a comment is none
[grid]                        # two
bays = [6, 7]                 # three
[[cases]]                     # four
name = "D"                    # five
loads = [{on = "beams", w = 5}] # six, and 3 + 2 for the inline table
s = "{not = 1}"               # twelve
`
	if got := Entries([]byte(src)); got != 12 {
		t.Errorf("Entries = %d, want 12", got)
	}
	if got := Entries(nil); got != 0 {
		t.Errorf("Entries(nil) = %d, want 0", got)
	}
}
