package lsp

// This file reads a large textDocument/didOpen without decoding it
// twice. jsonrpc2 decodes each message into its envelope, scanning the
// params, and didOpen then unmarshals the params, copying the text into a
// string and that string into the document's bytes: for a list of
// 100,000 records (6 MB) about a seventh of a second before the analysis
// starts, and three copies of the text to fault in and collect. Here the
// frame's own buffer becomes the document: its text is unescaped in
// place. Anything this reader does not take exactly as encoding/json
// would (a key in other case, a number
// that is not a plain int32, text that is not valid UTF-8) goes the
// ordinary way.

import (
	"bytes"
	"encoding/json"
	"strconv"
	"strings"
	"sync"
	"unicode/utf16"
	"unicode/utf8"

	"go.lsp.dev/jsonrpc2"
)

// prereadFrom is the size from which a didOpen frame is read here: the
// ordinary way costs little below it.
const prereadFrom = 1 << 20

// methodPrereadOpen is the notification the stream hands the server for a
// didOpen it has read: the document waits in the stream's slot. A client
// that sends it finds the slot empty, and the notification is ignored.
const methodPrereadOpen = "$/stereoline/didOpenRead"

// prereadOpen is the textDocument of a didOpen read from its frame.
type prereadOpen struct {
	uri, languageID string
	version         int32
	text            []byte // in the frame's buffer
}

// prereadSlot passes a didOpen read by the stream to the server. The
// connection handles a notification before it reads the next message, so
// one slot is enough; put replaces what nobody took.
type prereadSlot struct {
	mu   sync.Mutex
	open *prereadOpen
}

func (p *prereadSlot) put(o *prereadOpen) {
	p.mu.Lock()
	p.open = o
	p.mu.Unlock()
}

func (p *prereadSlot) take() *prereadOpen {
	p.mu.Lock()
	defer p.mu.Unlock()
	o := p.open
	p.open = nil
	return o
}

// preread reads data as a didOpen notification into the slot and returns
// the notification that stands for it, or false, leaving data as it was.
func (p *prereadSlot) preread(data []byte) (jsonrpc2.Message, bool) {
	o, ok := readDidOpen(data)
	if !ok {
		return nil, false
	}
	n, err := jsonrpc2.NewNotification(methodPrereadOpen, nil)
	if err != nil {
		return nil, false
	}
	p.put(o)
	return n, true
}

// didOpenRead opens the document the stream read.
func (s *Server) didOpenRead(json.RawMessage) error {
	o := s.preread.take()
	if o == nil {
		return nil
	}
	s.open(&fileVersion{URI: o.uri, Name: uriPath(o.uri), LanguageID: o.languageID, Version: o.version}, o.text)
	return nil
}

// readDidOpen reads a JSON-RPC notification textDocument/didOpen whose
// members are exactly those of the protocol (any extra member inside
// params and textDocument is skipped, as encoding/json does). On success
// the text is unescaped in place, in data; on failure data is unchanged.
func readDidOpen(data []byte) (*prereadOpen, bool) {
	r := jsonReader{b: data}
	var (
		o                                         prereadOpen
		text                                      jsonString
		sawVersion, sawMethod, sawParams, sawText bool
		sawURI                                    bool
	)
	doc := func() bool {
		return r.object(func(key string) bool {
			switch key {
			case "uri", "languageId":
				s, ok := r.str()
				if !ok {
					return false
				}
				v := string(data[s.from:s.to])
				if (s.escapes || !utf8.ValidString(v)) && json.Unmarshal(data[s.from-1:s.to+1], &v) != nil {
					return false
				}
				if key == "uri" {
					o.uri, sawURI = v, true
				} else {
					o.languageID = v
				}
			case "version":
				num, ok := r.number()
				if !ok || !json.Valid(num) {
					return false
				}
				v, err := strconv.ParseInt(string(num), 10, 32)
				if err != nil {
					return false
				}
				o.version = int32(v)
			case "text":
				s, ok := r.str()
				if !ok {
					return false
				}
				text, sawText = s, true
			default:
				if foldsTo(key, "uri", "languageId", "version", "text") {
					return false
				}
				return r.skip(0)
			}
			return true
		})
	}
	ok := r.object(func(key string) bool {
		switch key {
		case "jsonrpc":
			s, ok := r.str()
			sawVersion = ok && !s.escapes && string(data[s.from:s.to]) == "2.0"
			return sawVersion
		case "method":
			s, ok := r.str()
			sawMethod = ok && !s.escapes && string(data[s.from:s.to]) == "textDocument/didOpen"
			return sawMethod
		case "params":
			sawParams = true
			return r.object(func(key string) bool {
				switch {
				case key == "textDocument":
					return doc()
				case foldsTo(key, "textDocument"):
					return false
				}
				return r.skip(0)
			})
		}
		return false // an id, a result, an error: not a notification read here
	})
	r.space()
	if !ok || r.i != len(data) || !sawVersion || !sawMethod || !sawParams || !sawText || !sawURI {
		return nil, false
	}
	raw := data[text.from:text.to]
	if !utf8.Valid(raw) {
		return nil, false // encoding/json replaces what does not decode
	}
	o.text = raw
	if text.escapes {
		o.text = unescapeInPlace(raw)
	}
	return &o, true
}

// foldsTo reports whether key is one of names in another case, which
// encoding/json would match and this reader does not.
func foldsTo(key string, names ...string) bool {
	for _, n := range names {
		if strings.EqualFold(key, n) {
			return true
		}
	}
	return false
}

// jsonReader reads the few JSON shapes readDidOpen needs. It reports
// false on anything else; it never changes the bytes.
type jsonReader struct {
	b []byte
	i int
}

// jsonString is where a string's content lies, without its quotes.
type jsonString struct {
	from, to int
	escapes  bool // it holds a backslash escape
}

// maxSkipDepth bounds the nesting of a member skipped.
const maxSkipDepth = 64

func (r *jsonReader) space() {
	for r.i < len(r.b) {
		switch r.b[r.i] {
		case ' ', '\t', '\n', '\r':
			r.i++
		default:
			return
		}
	}
}

// object reads an object, calling member for each key with the reader on
// the member's value; member reads the value.
func (r *jsonReader) object(member func(key string) bool) bool {
	r.space()
	if r.i >= len(r.b) || r.b[r.i] != '{' {
		return false
	}
	r.i++
	r.space()
	if r.i < len(r.b) && r.b[r.i] == '}' {
		r.i++
		return true
	}
	for {
		r.space()
		k, ok := r.str()
		if !ok || k.escapes {
			return false
		}
		r.space()
		if r.i >= len(r.b) || r.b[r.i] != ':' {
			return false
		}
		r.i++
		r.space()
		if !member(string(r.b[k.from:k.to])) {
			return false
		}
		r.space()
		if r.i >= len(r.b) {
			return false
		}
		switch r.b[r.i] {
		case ',':
			r.i++
		case '}':
			r.i++
			return true
		default:
			return false
		}
	}
}

// str reads a string. Its escapes are checked to be JSON's; a raw control
// character is refused.
func (r *jsonReader) str() (jsonString, bool) {
	if r.i >= len(r.b) || r.b[r.i] != '"' {
		return jsonString{}, false
	}
	s := jsonString{from: r.i + 1}
	i := s.from
	for {
		k := bytes.IndexAny(r.b[i:], "\"\\")
		if k < 0 {
			return jsonString{}, false
		}
		for _, c := range r.b[i : i+k] {
			if c < 0x20 {
				return jsonString{}, false
			}
		}
		i += k
		if r.b[i] == '"' {
			s.to = i
			r.i = i + 1
			return s, true
		}
		if i+1 >= len(r.b) {
			return jsonString{}, false
		}
		s.escapes = true
		switch r.b[i+1] {
		case '"', '\\', '/', 'b', 'f', 'n', 'r', 't':
			i += 2
		case 'u':
			if i+6 > len(r.b) {
				return jsonString{}, false
			}
			for _, c := range r.b[i+2 : i+6] {
				if !isHex(c) {
					return jsonString{}, false
				}
			}
			i += 6
		default:
			return jsonString{}, false
		}
	}
}

// hex4 reads the four hex digits str checked.
func hex4(h []byte) rune {
	var r rune
	for _, c := range h {
		switch {
		case c <= '9':
			c -= '0'
		case c <= 'F':
			c -= 'A' - 10
		default:
			c -= 'a' - 10
		}
		r = r<<4 | rune(c)
	}
	return r
}

func isHex(c byte) bool {
	return '0' <= c && c <= '9' || 'a' <= c && c <= 'f' || 'A' <= c && c <= 'F'
}

// number reads a number as written.
func (r *jsonReader) number() ([]byte, bool) {
	from := r.i
	for r.i < len(r.b) {
		c := r.b[r.i]
		if !('0' <= c && c <= '9' || c == '-' || c == '+' || c == '.' || c == 'e' || c == 'E') {
			break
		}
		r.i++
	}
	return r.b[from:r.i], r.i > from
}

// skip reads any value; only its shape is checked (a number or literal
// is taken as the run of characters that can make one, and left to
// encoding/json's judgement no further: a member skipped here is one
// encoding/json ignores too).
func (r *jsonReader) skip(depth int) bool {
	if depth > maxSkipDepth || r.i >= len(r.b) {
		return false
	}
	switch c := r.b[r.i]; {
	case c == '"':
		_, ok := r.str()
		return ok
	case c == '{':
		return r.object(func(string) bool { return r.skip(depth + 1) })
	case c == '[':
		r.i++
		r.space()
		if r.i < len(r.b) && r.b[r.i] == ']' {
			r.i++
			return true
		}
		for {
			r.space()
			if !r.skip(depth + 1) {
				return false
			}
			r.space()
			if r.i >= len(r.b) {
				return false
			}
			switch r.b[r.i] {
			case ',':
				r.i++
			case ']':
				r.i++
				return true
			default:
				return false
			}
		}
	case c == '-' || '0' <= c && c <= '9':
		num, _ := r.number()
		return json.Valid(num)
	}
	for _, lit := range []string{"true", "false", "null"} {
		if bytes.HasPrefix(r.b[r.i:], []byte(lit)) {
			r.i += len(lit)
			return true
		}
	}
	return false
}

// unescapeInPlace resolves the escapes of a string's content that str
// accepted, writing over b (each escape is longer than what it stands
// for), and returns the result. A \u escape of half a surrogate pair
// that does not pair gives U+FFFD, as in encoding/json.
func unescapeInPlace(b []byte) []byte {
	w := 0
	for r := 0; r < len(b); {
		k := bytes.IndexByte(b[r:], '\\')
		if k < 0 {
			w += copy(b[w:], b[r:])
			break
		}
		w += copy(b[w:], b[r:r+k])
		r += k
		c := b[r+1]
		if c == 'u' {
			rr := hex4(b[r+2 : r+6])
			r += 6
			if utf16.IsSurrogate(rr) {
				if r+6 <= len(b) && b[r] == '\\' && b[r+1] == 'u' {
					if dec := utf16.DecodeRune(rr, hex4(b[r+2:r+6])); dec != utf8.RuneError {
						w += utf8.EncodeRune(b[w:], dec)
						r += 6
						continue
					}
				}
				rr = utf8.RuneError
			}
			w += utf8.EncodeRune(b[w:], rr)
			continue
		}
		switch c {
		case 'b':
			c = '\b'
		case 'f':
			c = '\f'
		case 'n':
			c = '\n'
		case 'r':
			c = '\r'
		case 't':
			c = '\t'
		}
		b[w] = c
		w++
		r += 2
	}
	return b[:w]
}
