package modelfile

import (
	"errors"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/BurntSushi/toml"
)

// This file finds where the keys and tables of a TOML document sit in its
// source, for both readers: of model files and of rule files. It depends
// on nothing else in the package.
//
// The decoder (BurntSushi/toml) knows the position of every key while it
// parses, but keeps it to itself: MetaData lists the keys it read, in file
// order, without their positions (and its private record of positions
// is keyed by dotted name, so the elements of an array of tables share one
// entry). keyPositions therefore runs a small TOML lexer over the source
// (it understands strings of all four kinds, comments, arrays and inline
// tables, so a line of a multi-line string that looks like a table header
// or a key is never taken for one) and checks that the keys it finds are,
// one for one and in order, the keys the decoder lists. Only then are its
// positions used; were they ever to differ, every position would be
// unknown (0) rather than possibly wrong.
//
// The check runs once, right after decoding. The index that answers
// queries is built on the first query, by a second pass: a file without
// problems never needs one.

// place names a table of a document by its path from the top level: each
// step a key, and for an element of an array of tables its index. The zero
// place is the top level. Places are cheap to make; keyPositions resolves
// one to the table it names when a position is asked for, and remembers it.
type place struct {
	up   *place
	key  string
	elem int32 // index in the array of tables; -1 for a plain table
	idx  int32 // the entry of the table once resolved: unresolved, notFound, or an entry
}

const (
	unresolved int32 = 0 // the zero value, so that a new place is unresolved
	notFound   int32 = -1
	rootEntry  int32 = -2
)

// subPlace returns the place of the table named key in p.
func (p *place) subPlace(key string) place { return place{up: p, key: key, elem: -1} }

// elemPlace returns the place of element i of the array of tables named key in p.
func (p *place) elemPlace(key string, i int) place {
	return place{up: p, key: key, elem: int32(i)}
}

func (p *place) isRoot() bool { return p.up == nil }

// keyPositions answers where a key of a table is. The zero value knows no
// positions.
type keyPositions struct {
	src    string
	agrees bool // the lexer found exactly the keys the decoder lists

	built   bool
	entries []keyEntry
	first   int32 // first child of the top level
	names   map[string]int32
	elems   map[[2]int32][]int32 // (parent, name) → the elements of an array of tables
}

// keyEntry is one key or table of the document. Entries are numbered from
// 1, in file order (entry 0 is unused, so that a zero place is unresolved).
type keyEntry struct {
	first, next int32 // first child and next sibling; -1 for none
	name        int32
	line, off   int32 // 1-based line; byte offset (for a column, when one is wanted)
	kind        entryKind
}

type entryKind uint8

const (
	kindKey        entryKind = iota // key = value (not an inline table)
	kindInline                      // key = { … }
	kindHeader                      // [table]
	kindImplicit                    // a table only implied: by [a.b] without [a], or by a dotted key a.b = 1
	kindElem                        // [[array]] element
	kindInlineElem                  // an inline table inside an array value
)

// newKeyPositions checks src against keys, the keys its decoder read in
// file order (MetaData.Keys), and returns what can then locate them.
func newKeyPositions(src string, keys []toml.Key) *keyPositions {
	kp := &keyPositions{src: src}
	v := &verifier{keys: keys}
	if err := lexKeys(src, v); err == nil && v.ok() {
		kp.agrees = true
	}
	return kp
}

// line returns the line of key in the table at p; else of the table or
// array of tables named key in it; else of the table itself (0 for the top
// level). It returns 0 when the positions are unknown.
func (kp *keyPositions) line(p *place, key string) int {
	e := kp.lookup(p, key)
	if e <= 0 {
		return 0
	}
	return int(kp.entries[e].line)
}

func (kp *keyPositions) lookup(p *place, key string) int32 {
	if kp == nil || !kp.agrees {
		return notFound
	}
	if !kp.built {
		kp.build()
	}
	if !kp.agrees {
		return notFound
	}
	t := kp.resolve(p)
	for t == notFound && !p.isRoot() { // the nearest table that is in the file
		p = p.up
		t = kp.resolve(p)
		key = ""
	}
	if key != "" {
		if c := kp.child(t, key); c > 0 {
			return c
		}
	}
	if t == rootEntry {
		return notFound
	}
	return t
}

// resolve returns the entry of the table at p, rootEntry or notFound.
func (kp *keyPositions) resolve(p *place) int32 {
	if p.isRoot() {
		return rootEntry
	}
	if p.idx != unresolved {
		return p.idx
	}
	parent := kp.resolve(p.up)
	p.idx = notFound
	if parent == notFound {
		return notFound
	}
	if p.elem < 0 {
		for c := kp.firstChild(parent); c > 0; c = kp.entries[c].next {
			if e := &kp.entries[c]; kp.isName(e.name, p.key) && (e.kind == kindHeader || e.kind == kindImplicit || e.kind == kindInline) {
				p.idx = c
				break
			}
		}
		return p.idx
	}
	id, ok := kp.names[p.key]
	if !ok {
		return notFound
	}
	list, ok := kp.elems[[2]int32{parent, id}]
	if !ok {
		for c := kp.firstChild(parent); c > 0; c = kp.entries[c].next {
			e := &kp.entries[c]
			switch {
			case e.name != id:
			case e.kind == kindElem:
				list = append(list, c)
			case e.kind == kindKey: // an array value: its inline tables
				for d := e.first; d > 0; d = kp.entries[d].next {
					if kp.entries[d].kind == kindInlineElem {
						list = append(list, d)
					}
				}
			}
		}
		kp.elems[[2]int32{parent, id}] = list
	}
	if int(p.elem) < len(list) {
		p.idx = list[p.elem]
	}
	return p.idx
}

func (kp *keyPositions) firstChild(t int32) int32 {
	if t == rootEntry {
		return kp.first
	}
	return kp.entries[t].first
}

func (kp *keyPositions) isName(id int32, s string) bool {
	n, ok := kp.names[s]
	return ok && n == id
}

// child returns the first entry named key in table t, or notFound.
func (kp *keyPositions) child(t int32, key string) int32 {
	id, ok := kp.names[key]
	if !ok {
		return notFound
	}
	for c := kp.firstChild(t); c > 0; c = kp.entries[c].next {
		if kp.entries[c].name == id {
			return c
		}
	}
	return notFound
}

// build indexes every key and table of the source.
func (kp *keyPositions) build() {
	kp.built = true
	b := &builder{kp: kp, latest: map[[2]int32]int32{}}
	kp.names = map[string]int32{}
	kp.elems = map[[2]int32][]int32{}
	kp.entries = []keyEntry{{}} // entry 0 is unused
	kp.first = -1
	b.last = []int32{-1}
	b.stack = []bframe{{entry: rootEntry}}
	if err := lexKeys(kp.src, b); err != nil {
		kp.agrees = false // cannot happen: the first pass lexed it
	}
	b.last = nil
}

// keyVisitor receives what the lexer finds, in file order: table headers
// and keys with their positions, and the start and end of every array and
// inline table value.
type keyVisitor interface {
	header(parts []string, array bool, off, line int)
	key(parts []string, off, line int)
	open(table bool, off, line int) // an inline table or array value starts
	close()                         // it ends
}

// verifier compares what the lexer finds with the decoder's keys.
type verifier struct {
	keys   []toml.Key
	n      int  // keys matched so far
	bad    bool // a key differs
	ctx    []string
	last   []string // the path of the last key
	frames []vframe
}

// vframe is an inline table or array value being lexed, with the path its
// keys (or its tables' keys) take.
type vframe struct {
	path  []string
	array bool
}

func (v *verifier) ok() bool { return !v.bad && v.n == len(v.keys) }

func (v *verifier) match(path []string) {
	if v.bad || v.n >= len(v.keys) || len(v.keys[v.n]) != len(path) {
		v.bad = true
		return
	}
	for i, s := range path {
		if v.keys[v.n][i] != s {
			v.bad = true
			return
		}
	}
	v.n++
}

func (v *verifier) header(parts []string, _ bool, _, _ int) {
	v.ctx = append(v.ctx[:0], parts...)
	v.frames = v.frames[:0]
	v.match(parts)
}

func (v *verifier) key(parts []string, _, _ int) {
	base := v.ctx
	if n := len(v.frames); n > 0 {
		base = v.frames[n-1].path
	}
	v.last = append(append(v.last[:0], base...), parts...)
	v.match(v.last)
}

// open starts a value whose keys take the path of the key it is the value
// of, or, inside an array value, the array's.
func (v *verifier) open(table bool, _, _ int) {
	path := v.last
	if n := len(v.frames); n > 0 && v.frames[n-1].array {
		path = v.frames[n-1].path
	}
	v.frames = append(v.frames, vframe{path: append([]string(nil), path...), array: !table})
}

func (v *verifier) close() { v.frames = v.frames[:len(v.frames)-1] }

// builder builds the index of a keyPositions.
type builder struct {
	kp      *keyPositions
	latest  map[[2]int32]int32 // (parent, name) → the latest table of that name
	last    []int32            // last child of each entry (build time only)
	stack   []bframe
	lastKey int32 // the last key
}

type bframe struct {
	entry int32
	array bool
}

func (b *builder) name(s string) int32 {
	kp := b.kp
	if id, ok := kp.names[s]; ok {
		return id
	}
	id := int32(len(kp.names))
	kp.names[strings.Clone(s)] = id
	return id
}

// add appends an entry as the last child of parent.
func (b *builder) add(parent, name int32, kind entryKind, off, line int) int32 {
	kp := b.kp
	e := int32(len(kp.entries))
	kp.entries = append(kp.entries, keyEntry{first: -1, next: -1, name: name, line: int32(line), off: int32(off), kind: kind})
	b.last = append(b.last, -1)
	li := int32(0) // index into last of the parent: the top level's is 0
	if parent != rootEntry {
		li = parent
	}
	if prev := b.last[li]; prev > 0 {
		kp.entries[prev].next = e
	} else if parent == rootEntry {
		kp.first = e
	} else {
		kp.entries[parent].first = e
	}
	b.last[li] = e
	return e
}

// table returns the table named name in parent, the latest element for an
// array of tables, making an implicit one when there is none.
func (b *builder) table(parent int32, name string, off, line int) int32 {
	k := [2]int32{parent, b.name(name)}
	if t, ok := b.latest[k]; ok {
		return t
	}
	t := b.add(parent, k[1], kindImplicit, off, line)
	b.latest[k] = t
	return t
}

func (b *builder) header(parts []string, array bool, off, line int) {
	t := rootEntry
	for _, p := range parts[:len(parts)-1] {
		t = b.table(t, p, off, line)
	}
	leaf := parts[len(parts)-1]
	k := [2]int32{t, b.name(leaf)}
	if array {
		e := b.add(t, k[1], kindElem, off, line)
		b.latest[k] = e
		t = e
	} else if e, ok := b.latest[k]; ok && b.kp.entries[e].kind == kindImplicit {
		// [a] after [a.b]: the implicit table is now defined here.
		b.kp.entries[e].kind, b.kp.entries[e].line, b.kp.entries[e].off = kindHeader, int32(line), int32(off)
		t = e
	} else {
		e := b.add(t, k[1], kindHeader, off, line)
		b.latest[k] = e
		t = e
	}
	b.stack = append(b.stack[:0], bframe{entry: t})
}

func (b *builder) key(parts []string, off, line int) {
	t := b.stack[len(b.stack)-1].entry
	for _, p := range parts[:len(parts)-1] {
		t = b.table(t, p, off, line)
	}
	b.lastKey = b.add(t, b.name(parts[len(parts)-1]), kindKey, off, line)
}

func (b *builder) open(table bool, off, line int) {
	top := b.stack[len(b.stack)-1]
	owner := b.lastKey
	if top.array {
		owner = top.entry
	}
	if !table {
		b.stack = append(b.stack, bframe{entry: owner, array: true})
		return
	}
	if top.array { // a table inside an array value
		t := b.add(owner, b.kp.entries[owner].name, kindInlineElem, off, line)
		b.stack = append(b.stack, bframe{entry: t})
		return
	}
	b.kp.entries[owner].kind = kindInline
	b.stack = append(b.stack, bframe{entry: owner})
}

func (b *builder) close() { b.stack = b.stack[:len(b.stack)-1] }

// errLex marks source the lexer does not understand; it cannot happen for
// a document the decoder accepted.
var errLex = errors.New("toml lexer: unexpected input")

// lexKeys lexes src, a document the decoder has accepted, calling v for
// each header, key and value that opens or closes.
func lexKeys(src string, v keyVisitor) (err error) {
	lx := &lexer{src: src, line: 1, v: v}
	defer func() {
		if r := recover(); r != nil {
			if r != errLex {
				panic(r)
			}
			err = errLex
		}
	}()
	// Byte order marks, skipped as the decoder skips them.
	switch {
	case strings.HasPrefix(src, "\xef\xbb\xbf"):
		lx.pos = 3
	case strings.HasPrefix(src, "\xff\xfe"), strings.HasPrefix(src, "\xfe\xff"):
		lx.pos = 2
	}
	lx.document()
	return nil
}

type lexer struct {
	src   string
	pos   int
	line  int
	v     keyVisitor
	parts []string
}

func (lx *lexer) fail() { panic(errLex) }

func (lx *lexer) peek() byte {
	if lx.pos < len(lx.src) {
		return lx.src[lx.pos]
	}
	return 0
}

func (lx *lexer) spaces() {
	for lx.pos < len(lx.src) && (lx.src[lx.pos] == ' ' || lx.src[lx.pos] == '\t') {
		lx.pos++
	}
}

// gaps skips spaces, newlines and comments, as between the values of an
// array.
func (lx *lexer) gaps() {
	for lx.pos < len(lx.src) {
		switch lx.src[lx.pos] {
		case ' ', '\t', '\r':
			lx.pos++
		case '\n':
			lx.pos++
			lx.line++
		case '#':
			lx.comment()
		default:
			return
		}
	}
}

func (lx *lexer) comment() {
	if i := strings.IndexByte(lx.src[lx.pos:], '\n'); i >= 0 {
		lx.pos += i
	} else {
		lx.pos = len(lx.src)
	}
}

func (lx *lexer) document() {
	for {
		lx.gaps()
		if lx.pos >= len(lx.src) {
			return
		}
		off, line := lx.pos, lx.line
		if lx.src[lx.pos] == '[' {
			array := strings.HasPrefix(lx.src[lx.pos:], "[[")
			lx.pos++
			if array {
				lx.pos++
			}
			parts := lx.keyParts()
			lx.spaces()
			if array {
				lx.expect("]]")
			} else {
				lx.expect("]")
			}
			lx.v.header(parts, array, off, line)
		} else {
			lx.keyValue()
		}
		lx.endOfLine()
	}
}

// endOfLine expects nothing but spaces and a comment up to the line end.
func (lx *lexer) endOfLine() {
	lx.spaces()
	switch c := lx.peek(); {
	case c == '#':
		lx.comment()
	case c == '\r' || c == '\n' || lx.pos >= len(lx.src):
	default:
		lx.fail()
	}
}

func (lx *lexer) expect(s string) {
	if !strings.HasPrefix(lx.src[lx.pos:], s) {
		lx.fail()
	}
	lx.pos += len(s)
}

// keyValue lexes key = value.
func (lx *lexer) keyValue() {
	off, line := lx.pos, lx.line
	parts := lx.keyParts()
	lx.spaces()
	lx.expect("=")
	lx.v.key(parts, off, line)
	lx.spaces()
	lx.value()
}

// keyParts lexes a key, dotted or not; the slice is reused by the next call.
func (lx *lexer) keyParts() []string {
	lx.parts = lx.parts[:0]
	for {
		lx.spaces()
		lx.parts = append(lx.parts, lx.keyPart())
		lx.spaces()
		if lx.peek() != '.' {
			return lx.parts
		}
		lx.pos++
	}
}

func isBare(c byte) bool {
	return c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' || c >= '0' && c <= '9' || c == '_' || c == '-'
}

func (lx *lexer) keyPart() string {
	switch lx.peek() {
	case '"':
		end := lx.basicEnd(lx.pos + 1)
		s := lx.unescape(lx.src[lx.pos+1 : end-1])
		lx.pos = end
		return s
	case '\'':
		i := strings.IndexByte(lx.src[lx.pos+1:], '\'')
		if i < 0 {
			lx.fail()
		}
		s := lx.src[lx.pos+1 : lx.pos+1+i]
		lx.pos += i + 2
		return s
	}
	start := lx.pos
	for lx.pos < len(lx.src) && isBare(lx.src[lx.pos]) {
		lx.pos++
	}
	if lx.pos == start {
		lx.fail()
	}
	return lx.src[start:lx.pos]
}

// basicEnd returns the offset just past the closing quote of the basic
// string whose content starts at i.
func (lx *lexer) basicEnd(i int) int {
	for ; i < len(lx.src); i++ {
		switch lx.src[i] {
		case '\\':
			i++
		case '"':
			return i + 1
		case '\n':
			lx.fail()
		}
	}
	lx.fail()
	return 0
}

// unescape decodes the escapes of a basic string as TOML defines them.
func (lx *lexer) unescape(s string) string {
	if strings.IndexByte(s, '\\') < 0 {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); i++ {
		if s[i] != '\\' {
			b.WriteByte(s[i])
			continue
		}
		i++
		if i >= len(s) {
			lx.fail()
		}
		n := 0
		switch s[i] {
		case 'b':
			b.WriteByte('\b')
		case 't':
			b.WriteByte('\t')
		case 'n':
			b.WriteByte('\n')
		case 'f':
			b.WriteByte('\f')
		case 'r':
			b.WriteByte('\r')
		case 'e':
			b.WriteByte(0x1b)
		case '"', '\\':
			b.WriteByte(s[i])
		case 'x':
			n = 2
		case 'u':
			n = 4
		case 'U':
			n = 8
		default:
			lx.fail()
		}
		if n > 0 {
			if i+1+n > len(s) {
				lx.fail()
			}
			r, err := strconv.ParseUint(s[i+1:i+1+n], 16, 32)
			if err != nil || !utf8.ValidRune(rune(r)) {
				lx.fail()
			}
			b.WriteRune(rune(r))
			i += n
		}
	}
	return b.String()
}

// value lexes a value: a string, array, inline table, or anything else
// (numbers, booleans, dates), which ends at a delimiter.
func (lx *lexer) value() {
	switch c := lx.peek(); c {
	case '"', '\'':
		lx.str(c)
	case '[':
		lx.v.open(false, lx.pos, lx.line)
		lx.pos++
		for {
			lx.gaps()
			if lx.peek() == ']' {
				lx.pos++
				break
			}
			lx.value()
			lx.gaps()
			switch lx.peek() {
			case ',':
				lx.pos++
			case ']':
			default:
				lx.fail()
			}
		}
		lx.v.close()
	case '{':
		lx.v.open(true, lx.pos, lx.line)
		lx.pos++
		for {
			lx.gaps()
			if lx.peek() == '}' {
				lx.pos++
				break
			}
			lx.keyValue()
			lx.gaps()
			switch lx.peek() {
			case ',':
				lx.pos++
			case '}':
			default:
				lx.fail()
			}
		}
		lx.v.close()
	default:
		start := lx.pos
		for lx.pos < len(lx.src) && strings.IndexByte(",]}#\r\n", lx.src[lx.pos]) < 0 {
			lx.pos++
		}
		if lx.pos == start {
			lx.fail()
		}
	}
}

// str lexes a string of any of the four kinds, counting its lines.
func (lx *lexer) str(q byte) {
	src := lx.src
	three := string([]byte{q, q, q})
	if !strings.HasPrefix(src[lx.pos:], three) {
		if q == '"' {
			lx.pos = lx.basicEnd(lx.pos + 1)
			return
		}
		i := strings.IndexAny(src[lx.pos+1:], "'\n")
		if i < 0 || src[lx.pos+1+i] != '\'' {
			lx.fail()
		}
		lx.pos += i + 2
		return
	}
	i := lx.pos + 3
	for ; i < len(src); i++ {
		switch src[i] {
		case '\n':
			lx.line++
		case '\\':
			if q == '"' {
				if i+1 < len(src) && src[i+1] == '\n' {
					lx.line++
				}
				i++
			}
		case q:
			if strings.HasPrefix(src[i:], three) {
				end := i + 3
				for k := 0; k < 2 && end < len(src) && src[end] == q; k++ {
					end++ // up to two quotes of the content may precede the closing three
				}
				lx.pos = end
				return
			}
		}
	}
	lx.fail()
}
