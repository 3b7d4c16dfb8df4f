// Command scaleclient drives `stereoline serve` as an editor would on a
// large record list and reports how long the server takes: the first
// publication of diagnostics after didOpen (and the one that carries the
// relations between records), the re-publication after one-line edits of
// each kind, hover round trips, and the server's peak memory (VmHWM from
// /proc/<pid>/status).
//
// It lives under testdata so `go build ./...` and `go test ./...` leave
// it alone; run it by path:
//
//	go build -o /tmp/stereoline ./cmd/stereoline
//	go run ./lsp/testdata/scaleclient -bin /tmp/stereoline -list /tmp/big100k.smi
//
// Times are measured at the client from sending a message to having read
// the whole frame of the answer (before decoding it), so they include the
// server's serialisation and the pipe, not the client's parsing. An
// edit's time includes the server's debounce (100 ms by default), which
// is reported beside it and subtracted in the "net" column.
package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"math/rand"
	"os"
	"os/exec"
	"runtime"
	"sort"
	"strconv"
	"strings"
	"sync"
	"time"
)

func main() {
	bin := flag.String("bin", "stereoline", "the `stereoline` binary")
	list := flag.String("list", "", "the record list to open (.smi)")
	hovers := flag.Int("hovers", 1000, "hover requests at random records")
	rounds := flag.Int("rounds", 5, "edits of each kind")
	debounce := flag.Duration("debounce", 100*time.Millisecond, "the server's debounce, subtracted from edit times")
	serverLog := flag.String("log", "", "pass --log FILE -v to the server")
	only := flag.String("kinds", "mark,title,insert,delete", "the kinds of edit to make, in this order (also insert-top, delete-top)")
	settle := flag.Duration("settle", 0, "wait this long after the open before the first edit (a user reads first)")
	pause := flag.Duration("pause", 0, "wait this long after each publication before the next edit (a user typing, not a script)")
	flag.Parse()
	if *list == "" {
		fmt.Fprintln(os.Stderr, "usage: scaleclient -bin BIN -list FILE.smi")
		os.Exit(2)
	}
	text, err := os.ReadFile(*list)
	if err != nil {
		fail(err)
	}
	args := []string{"serve"}
	if *serverLog != "" {
		args = append(args, "--log", *serverLog, "-v")
	}
	c := startServer(*bin, args)
	defer c.cmd.Process.Kill()

	c.call("initialize", map[string]any{
		"processId": os.Getpid(),
		"rootUri":   nil,
		"capabilities": map[string]any{
			"textDocument": map[string]any{
				"publishDiagnostics": map[string]any{"relatedInformation": true, "versionSupport": true},
				"hover":              map[string]any{"contentFormat": []string{"markdown", "plaintext"}},
			},
		},
	})
	c.notify("initialized", map[string]any{})

	uri := "file:///scale/" + baseName(*list)
	doc := newDocument(string(text), languageID(*list) == "jsonl" || languageID(*list) == "json")
	fmt.Printf("list: %s, %d lines, %d bytes\n", *list, len(doc.lines), len(text))

	// The message is encoded before the clock starts: the 6 MB of JSON
	// cost this client about a quarter of a second, which an editor
	// spends (or not) before it sends, and which is not the server's.
	open := encode(map[string]any{"jsonrpc": "2.0", "method": "textDocument/didOpen",
		"params": map[string]any{"textDocument": map[string]any{
			"uri": uri, "languageId": languageID(*list), "version": 1, "text": string(text)}}})
	cpu0 := c.cpu()
	begun := time.Now()
	c.send(open)
	first := c.waitPublication(1, false)
	fmt.Printf("first publication:    %8.0f ms  (%d diagnostics, %d relations, %.1f MB)\n",
		ms(first.at.Sub(begun)), first.count, first.relations, float64(first.size)/1e6)
	full := first
	// Records in code and prose are not related: no relations to wait for.
	if lang := languageID(*list); first.relations == 0 && lang != "python" && lang != "markdown" {
		full = c.waitPublication(1, true)
	}
	fmt.Printf("with relations:       %8.0f ms  (%d diagnostics, %d relations); server CPU %.0f ms\n",
		ms(full.at.Sub(begun)), full.count, full.relations, ms(c.cpu()-cpu0))
	rss(c, "after open")
	time.Sleep(*settle)

	rng := rand.New(rand.NewSource(1))
	version := int32(1)
	type kind struct {
		name string
		make func(*document, *rand.Rand) (edit, bool)
	}
	known := map[string]kind{
		"mark":   {"change a mark", (*document).markEdit},
		"title":  {"change a title", (*document).titleEdit},
		"insert": {"insert a line", (*document).insertEdit},
		"delete": {"delete a line", (*document).deleteEdit},
		// at the top every record after the edit moves: the most work
		"insert-top": {"insert at the top", func(d *document, rng *rand.Rand) (edit, bool) {
			top := d.top()
			src := top + rng.Intn(len(d.lines)-2*top)
			if d.json {
				// an element that has its comma, before the first one
				for top > 0 && !strings.HasSuffix(d.lines[src], ",") {
					src = top + rng.Intn(len(d.lines)-2*top)
				}
				return edit{top, 0, top, 0, d.lines[src] + "\n"}, true
			}
			return edit{0, 0, 0, 0, d.notation(src) + "\tinserted-" + strconv.Itoa(src) + "\n"}, true
		}},
		"delete-top": {"delete the top", func(d *document, rng *rand.Rand) (edit, bool) {
			top := d.top()
			return edit{top, 0, top + 1, 0, ""}, true
		}},
	}
	var kinds []kind
	for _, k := range strings.Split(*only, ",") {
		if k, ok := known[k]; ok {
			kinds = append(kinds, k)
		}
	}
	fmt.Printf("%-16s %8s %8s %8s   (median of %d; debounce %v; server CPU time per edit)\n", "edit", "total", "net", "cpu", *rounds, *debounce)
	for _, k := range kinds {
		var times, cpus []time.Duration
		var last publication
		for r := 0; r < *rounds; r++ {
			e, ok := k.make(doc, rng)
			if !ok {
				break
			}
			time.Sleep(*pause)
			version++
			cpu := c.cpu()
			sent := time.Now()
			c.notify("textDocument/didChange", map[string]any{
				"textDocument":   map[string]any{"uri": uri, "version": version},
				"contentChanges": []any{e.change()},
			})
			last = c.waitPublication(version, false)
			times = append(times, last.at.Sub(sent))
			cpus = append(cpus, c.cpu()-cpu)
			// This client's copy of the text is made again after the
			// publication: tens of megabytes of strings, which would take
			// a core and collections from the server being measured.
			doc.apply(e)
			runtime.GC()
		}
		med := median(times)
		fmt.Printf("%-16s %8.1f %8.1f %8.1f ms  (%d diagnostics, %d relations)\n", k.name, ms(med), ms(med-*debounce), ms(median(cpus)), last.count, last.relations)
	}

	var lat []time.Duration
	for i := 0; i < *hovers; i++ {
		line := rng.Intn(len(doc.lines))
		n := len(doc.notation(line))
		if n == 0 {
			continue
		}
		char := rng.Intn(n)
		sent := time.Now()
		c.call("textDocument/hover", map[string]any{
			"textDocument": map[string]any{"uri": uri},
			"position":     map[string]any{"line": line, "character": char},
		})
		lat = append(lat, time.Since(sent))
	}
	sort.Slice(lat, func(i, j int) bool { return lat[i] < lat[j] })
	if len(lat) > 0 {
		fmt.Printf("hover (%d):           p50 %.2f ms  p99 %.2f ms  max %.2f ms\n", len(lat),
			ms(lat[len(lat)/2]), ms(lat[len(lat)*99/100]), ms(lat[len(lat)-1]))
	}
	rss(c, "at the end")
	c.call("shutdown", nil)
	c.notify("exit", nil)
	c.cmd.Wait()
}

// client is the client end of one server process.
type client struct {
	cmd  *exec.Cmd
	in   io.Writer
	mu   sync.Mutex // orders writes
	next int

	pending sync.Map // id -> chan json.RawMessage
	pubs    chan publication
	bodies  chan []byte // read buffers handed back for reuse
}

// publication is one publishDiagnostics notification as it arrived.
type publication struct {
	at        time.Time
	version   int32
	count     int
	relations int
	size      int
}

func startServer(bin string, args []string) *client {
	cmd := exec.Command(bin, args...)
	in, err := cmd.StdinPipe()
	if err != nil {
		fail(err)
	}
	out, err := cmd.StdoutPipe()
	if err != nil {
		fail(err)
	}
	cmd.Stderr = os.Stderr
	if err := cmd.Start(); err != nil {
		fail(err)
	}
	c := &client{cmd: cmd, in: in, pubs: make(chan publication, 64), bodies: make(chan []byte, 2)}
	go c.read(bufio.NewReaderSize(out, 1<<20))
	return c
}

func (c *client) write(msg map[string]any) { c.send(encode(msg)) }

// encode is the JSON body of a message.
func encode(msg map[string]any) []byte {
	body, err := json.Marshal(msg)
	if err != nil {
		fail(err)
	}
	return body
}

// send writes one framed message.
func (c *client) send(body []byte) {
	c.mu.Lock()
	defer c.mu.Unlock()
	fmt.Fprintf(c.in, "Content-Length: %d\r\n\r\n", len(body))
	c.in.Write(body)
}

func (c *client) notify(method string, params any) {
	c.write(map[string]any{"jsonrpc": "2.0", "method": method, "params": params})
}

func (c *client) call(method string, params any) json.RawMessage {
	c.mu.Lock()
	c.next++
	id := c.next
	c.mu.Unlock()
	ch := make(chan json.RawMessage, 1)
	c.pending.Store(id, ch)
	c.write(map[string]any{"jsonrpc": "2.0", "id": id, "method": method, "params": params})
	select {
	case r := <-ch:
		return r
	case <-time.After(2 * time.Minute):
		fail(fmt.Errorf("%s: no answer", method))
	}
	return nil
}

// read reads frames, timestamps each as soon as it is whole, answers the
// server's requests and hands on answers and publications.
// read reads frames and timestamps each as soon as it is whole; another
// goroutine decodes them (handle), so that the decoding of one 30 MB
// publication, this client's own cost, does not keep the server from
// writing the next: the time taken is the server's and the pipe's.
func (c *client) read(r *bufio.Reader) {
	frames := make(chan frame, 16)
	go c.handle(frames)
	defer close(frames)
	for {
		length := -1
		for {
			line, err := r.ReadString('\n')
			if err != nil {
				return
			}
			line = strings.TrimSpace(line)
			if line == "" {
				break
			}
			if v, ok := strings.CutPrefix(line, "Content-Length:"); ok {
				length, _ = strconv.Atoi(strings.TrimSpace(v))
			}
		}
		// Bodies are read into buffers handle gives back: a fresh 30 MB
		// buffer for each publication costs this client thousands of
		// page faults, during which the server waits on a full pipe.
		var body []byte
		select {
		case b := <-c.bodies:
			if cap(b) >= length {
				body = b[:length]
			}
		default:
		}
		if body == nil {
			// room for the publications of a few inserted lines
			body = make([]byte, length, length+length/8)
		}
		if _, err := io.ReadFull(r, body); err != nil {
			return
		}
		frames <- frame{body: body, at: time.Now()}
	}
}

// frame is one message as it arrived.
type frame struct {
	body []byte
	at   time.Time
}

// handle decodes the frames in order: publications go to c.pubs,
// answers to their callers, and requests from the server are answered.
func (c *client) handle(frames <-chan frame) {
	defer close(c.pubs)
	for fr := range frames {
		body, at := fr.body, fr.at
		if params, ok := bytes.CutPrefix(body, publicationHead); ok {
			// The server writes its publications with this head: the
			// 30 MB are counted, not decoded (see countPublication).
			p := countPublication(params, at, len(body))
			select {
			case c.bodies <- body:
			default:
			}
			c.pubs <- p
			continue
		}
		var msg struct {
			ID     *json.RawMessage `json:"id"`
			Method string           `json:"method"`
			Result json.RawMessage  `json:"result"`
			Params json.RawMessage  `json:"params"`
		}
		if err := json.Unmarshal(body, &msg); err != nil {
			fail(err)
		}
		switch {
		case msg.Method == "textDocument/publishDiagnostics":
			c.pubs <- countPublication(msg.Params, at, len(body))
		case msg.Method != "" && msg.ID != nil:
			// a request from the server (progress tokens, configuration)
			c.write(map[string]any{"jsonrpc": "2.0", "id": msg.ID, "result": nil})
		case msg.ID != nil:
			var id int
			json.Unmarshal(*msg.ID, &id)
			if ch, ok := c.pending.LoadAndDelete(id); ok {
				ch.(chan json.RawMessage) <- msg.Result
			}
		}
	}
}

// publicationHead is how the server begins a publication.
var publicationHead = []byte(`{"jsonrpc":"2.0","method":"textDocument/publishDiagnostics","params":`)

// countPublication reads the version of a publication and counts its
// diagnostics and relations without decoding them: on a machine of two
// cores, decoding 30 MB of JSON on every edit would take processor time
// from the server being measured. Each diagnostic the server writes
// starts with its range (related information starts with a location),
// and relations are the codes beginning "list-".
func countPublication(params []byte, at time.Time, size int) publication {
	var head struct {
		Version int32 `json:"version"`
	}
	if i := bytes.Index(params, []byte(`"diagnostics":`)); i >= 0 {
		json.Unmarshal(append(append([]byte{}, params[:i]...), `"x":0}`...), &head)
	}
	return publication{at: at, version: head.Version, size: size,
		count:     bytes.Count(params, []byte(`{"range":`)),
		relations: bytes.Count(params, []byte(`"code":"list-`))}
}

// waitPublication waits for a publication of version (with relations if
// asked), skipping earlier ones.
func (c *client) waitPublication(version int32, relations bool) publication {
	timeout := time.After(5 * time.Minute)
	for {
		select {
		case p, ok := <-c.pubs:
			if !ok {
				fail(fmt.Errorf("server ended"))
			}
			if p.version == version && (!relations || p.relations > 0) {
				return p
			}
		case <-timeout:
			fail(fmt.Errorf("no publication of version %d", version))
		}
	}
}

// cpu returns the user and system time the server has used so far
// (/proc/<pid>/stat, in clock ticks of 10 ms).
func (c *client) cpu() time.Duration {
	stat, err := os.ReadFile(fmt.Sprintf("/proc/%d/stat", c.cmd.Process.Pid))
	if err != nil {
		return 0
	}
	s := string(stat)
	fields := strings.Fields(s[strings.LastIndexByte(s, ')')+2:])
	utime, _ := strconv.Atoi(fields[11])
	stime, _ := strconv.Atoi(fields[12])
	return time.Duration(utime+stime) * 10 * time.Millisecond
}

// rss prints the server's current and peak resident memory.
func rss(c *client, when string) {
	status, err := os.ReadFile(fmt.Sprintf("/proc/%d/status", c.cmd.Process.Pid))
	if err != nil {
		fmt.Printf("memory %s: %v\n", when, err)
		return
	}
	var hwm, cur string
	for _, line := range strings.Split(string(status), "\n") {
		if v, ok := strings.CutPrefix(line, "VmHWM:"); ok {
			hwm = strings.TrimSpace(v)
		}
		if v, ok := strings.CutPrefix(line, "VmRSS:"); ok {
			cur = strings.TrimSpace(v)
		}
	}
	fmt.Printf("memory %s: peak RSS (VmHWM) %s, RSS %s\n", when, hwm, cur)
}

// document is the client's copy of the text, as lines.
// A document is the lines of the list; json says it is JSON Lines, one
// object a line, whose structure is the value of its "smiles" key.
type document struct {
	lines []string
	json  bool
}

func newDocument(text string, json bool) *document {
	lines := strings.Split(text, "\n")
	if len(lines) > 0 && lines[len(lines)-1] == "" {
		lines = lines[:len(lines)-1]
	}
	return &document{lines: lines, json: json}
}

// top is the first line of records: 1 in a JSON array written an
// element a line between a "[" line and a "]" line, else 0.
func (d *document) top() int {
	if d.json && len(d.lines) > 3 && d.lines[0] == "[" && d.lines[len(d.lines)-1] == "]" {
		return 1
	}
	return 0
}

// notation returns the first field of a line (of JSON Lines: the whole
// line, whose marks are all in its structure).
func (d *document) notation(line int) string {
	s := d.lines[line]
	if d.json {
		return s
	}
	if i := strings.IndexAny(s, " \t"); i >= 0 {
		return s[:i]
	}
	return s
}

// edit replaces the characters [from, to) of a line range with text.
type edit struct {
	line1, char1, line2, char2 int
	text                       string
}

func (e edit) change() map[string]any {
	return map[string]any{
		"range": map[string]any{
			"start": map[string]any{"line": e.line1, "character": e.char1},
			"end":   map[string]any{"line": e.line2, "character": e.char2},
		},
		"text": e.text,
	}
}

func (d *document) apply(e edit) {
	joined := strings.Join(d.lines, "\n") + "\n"
	off := func(line, char int) int {
		o := 0
		for i := 0; i < line; i++ {
			o += len(d.lines[i]) + 1
		}
		return o + char
	}
	a, b := off(e.line1, e.char1), off(e.line2, e.char2)
	*d = *newDocument(joined[:a]+e.text+joined[b:], d.json)
}

// markEdit turns one @@ into @ or one @ into @@ on a random line.
func (d *document) markEdit(rng *rand.Rand) (edit, bool) {
	for try := 0; try < 10000; try++ {
		line := rng.Intn(len(d.lines))
		n := d.notation(line)
		if i := strings.Index(n, "@@"); i >= 0 {
			return edit{line, i, line, i + 1, ""}, true
		}
		if i := strings.Index(n, "@"); i >= 0 {
			return edit{line, i, line, i, "@"}, true
		}
	}
	return edit{}, false
}

// titleEdit appends a character to the title of a random line.
func (d *document) titleEdit(rng *rand.Rand) (edit, bool) {
	line := rng.Intn(len(d.lines))
	at := len(d.lines[line])
	if d.json {
		// inside the last string of the object, its name
		at = max(strings.LastIndexByte(d.lines[line], '"'), 0)
	}
	return edit{line, at, line, at, "x"}, true
}

// insertEdit inserts a copy of a random line with a new title before
// another random line (a record that duplicates one already there).
func (d *document) insertEdit(rng *rand.Rand) (edit, bool) {
	src, at := rng.Intn(len(d.lines)), rng.Intn(len(d.lines))
	if d.json {
		return edit{at, 0, at, 0, d.lines[src] + "\n"}, true
	}
	return edit{at, 0, at, 0, d.notation(src) + "\tinserted-" + strconv.Itoa(src) + "\n"}, true
}

// deleteEdit deletes a random line.
func (d *document) deleteEdit(rng *rand.Rand) (edit, bool) {
	line := rng.Intn(len(d.lines) - 1)
	return edit{line, 0, line + 1, 0, ""}, true
}

func median(ds []time.Duration) time.Duration {
	if len(ds) == 0 {
		return 0
	}
	s := append([]time.Duration(nil), ds...)
	sort.Slice(s, func(i, j int) bool { return s[i] < s[j] })
	return s[len(s)/2]
}

func ms(d time.Duration) float64 { return float64(d) / float64(time.Millisecond) }

// languageID is what an editor calls a file of this name: tables by
// their own names, the rest notation.
func languageID(p string) string {
	switch {
	case strings.HasSuffix(p, ".csv"):
		return "csv"
	case strings.HasSuffix(p, ".tsv"):
		return "tsv"
	case strings.HasSuffix(p, ".jsonl"):
		return "jsonl"
	case strings.HasSuffix(p, ".json"):
		return "json"
	case strings.HasSuffix(p, ".py"):
		return "python"
	case strings.HasSuffix(p, ".md"):
		return "markdown"
	case strings.HasSuffix(p, ".yaml"), strings.HasSuffix(p, ".yml"):
		return "yaml"
	}
	return "smiles"
}

func baseName(p string) string {
	if i := strings.LastIndexByte(p, '/'); i >= 0 {
		return p[i+1:]
	}
	return p
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "scaleclient:", err)
	os.Exit(1)
}
