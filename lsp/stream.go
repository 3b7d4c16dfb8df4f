package lsp

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"strings"

	"go.lsp.dev/jsonrpc2"
)

// frameStream reads the base protocol's frames itself (LSP 3.17, "Base
// Protocol": header lines, a blank line, Content-Length bytes of
// content) and writes through jsonrpc2's stream. jsonrpc2's reader stops
// in the middle of a header that says Content-Length: 0, which leaves the
// stream unreadable; here an empty content is a whole frame whose content
// does not decode, skipped like any other (tolerantStream). The content
// is read as it arrives, so a header claiming gigabytes costs only what
// the client really sends.
type frameStream struct {
	jsonrpc2.Stream // Write and Close
	in              *bufio.Reader
	// preread, when set, takes large didOpen frames read here
	// (preread.go)
	preread *prereadSlot
}

func newFrameStream(conn io.ReadWriteCloser) frameStream {
	return frameStream{Stream: jsonrpc2.NewStream(conn), in: bufio.NewReader(conn)}
}

// errEmptyFrame is a frame with no content: not a message, but the next
// frame starts cleanly after it.
var errEmptyFrame = fmt.Errorf("%w: empty content", jsonrpc2.ErrInvalidRequest)

func (s frameStream) Read(ctx context.Context) (jsonrpc2.Message, int64, error) {
	if err := ctx.Err(); err != nil {
		return nil, 0, err
	}
	var total int64
	length := int64(-1)
	for {
		line, err := s.in.ReadString('\n')
		total += int64(len(line))
		if err != nil {
			return nil, total, fmt.Errorf("failed reading header line: %w", err)
		}
		line = strings.TrimSpace(line)
		if line == "" {
			break
		}
		name, value, ok := strings.Cut(line, ":")
		if !ok {
			return nil, total, fmt.Errorf("invalid header line %q", line)
		}
		if strings.EqualFold(strings.TrimSpace(name), jsonrpc2.HdrContentLength) {
			n, err := strconv.ParseInt(strings.TrimSpace(value), 10, 32)
			if err != nil || n < 0 {
				return nil, total, fmt.Errorf("invalid %s: %q", jsonrpc2.HdrContentLength, value)
			}
			length = n
		}
	}
	if length < 0 {
		return nil, total, fmt.Errorf("missing %s header", jsonrpc2.HdrContentLength)
	}
	if length == 0 {
		return nil, total, errEmptyFrame
	}
	data, err := readBody(s.in, length)
	total += int64(len(data))
	if err != nil {
		return nil, total, fmt.Errorf("read full of data: %w", err)
	}
	if length >= prereadFrom && s.preread != nil {
		if msg, ok := s.preread.preread(data); ok {
			return msg, total, nil
		}
	}
	msg, err := jsonrpc2.DecodeMessage(data)
	if resp, ok := msg.(*jsonrpc2.Response); ok {
		msg = emptyMethodCall(resp, data)
	}
	return msg, total, err
}

// bodyAtOnce is the largest body read into a buffer of its announced
// length; a larger one grows a buffer as it comes, so a header that
// announces gigabytes does not get them before they arrive.
const bodyAtOnce = 64 << 20

// readBody reads a body of length bytes: a large document (megabytes of
// text in one didOpen) goes into one buffer of its size, not copied
// through buffers doubling in turn.
func readBody(r io.Reader, length int64) ([]byte, error) {
	if length <= bodyAtOnce {
		data := make([]byte, length)
		n, err := io.ReadFull(r, data)
		return data[:n], err
	}
	var data bytes.Buffer
	_, err := io.CopyN(&data, r, length)
	return data.Bytes(), err
}

// emptyMethodCall turns back into a request what jsonrpc2 takes for a
// response: a message with an id and a method member that is the empty
// string. It is a request for a method the server does not have, and
// gets its MethodNotFound answer (JSON-RPC 2.0) instead of being dropped
// as the answer to a call nobody made.
func emptyMethodCall(resp *jsonrpc2.Response, data []byte) jsonrpc2.Message {
	var probe struct {
		Method *string          `json:"method"`
		Params *json.RawMessage `json:"params"`
	}
	if json.Unmarshal(data, &probe) != nil || probe.Method == nil {
		return resp
	}
	var params any
	if probe.Params != nil {
		params = *probe.Params
	}
	call, err := jsonrpc2.NewCall(resp.ID(), "", params)
	if err != nil {
		return resp
	}
	return call
}
