package walk

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
)

// Serve runs the JSON-lines loop of the bridge: it reads one request per
// line from r, runs it, and writes one response per line to w, in request
// order, each carrying the request's id (also on error lines, whenever the
// id could be read). A failing request produces an error line and the loop
// goes on; blank lines are skipped. Progress and log messages go to log
// (which may be nil), never to w.
//
// Serve returns nil at the end of input, the read or write error when r or
// w fails, and ctx.Err() when ctx is cancelled: the request in flight is
// answered with a "cancelled" error line first, and an idle Serve returns at
// once (its reading goroutine then ends when r next returns).
func Serve(ctx context.Context, r io.Reader, w io.Writer, log io.Writer) error {
	if log == nil {
		log = io.Discard
	}
	type msg struct {
		text []byte
		err  error
	}
	lines := make(chan msg)
	done := make(chan struct{})
	defer close(done)
	go func() {
		br := bufio.NewReaderSize(r, 1<<16)
		for {
			text, err := br.ReadBytes('\n')
			select {
			case lines <- msg{text, err}:
			case <-done:
				return
			}
			if err != nil {
				return
			}
		}
	}()
	for line := 1; ; line++ {
		var m msg
		select {
		case <-ctx.Done():
			return ctx.Err()
		case m = <-lines:
		}
		if m.err != nil && !errors.Is(m.err, io.EOF) {
			return fmt.Errorf("walk: reading request line %d: %w", line, m.err)
		}
		if len(bytes.TrimSpace(m.text)) > 0 {
			resp := serveLine(ctx, m.text, log, line)
			out, err := encodeLine(resp)
			if err != nil {
				out, _ = encodeLine(&Response{ID: resp.ID, Error: &ErrorBody{Code: "numerical",
					Message: "the response could not be encoded: " + err.Error()}})
			}
			if _, err := w.Write(out); err != nil {
				return fmt.Errorf("walk: writing response %d: %w", line, err)
			}
			if err := ctx.Err(); err != nil {
				return err
			}
		}
		if m.err != nil { // io.EOF
			return nil
		}
	}
}

// serveLine decodes and runs one request; it never panics.
func serveLine(ctx context.Context, text []byte, log io.Writer, line int) (resp *Response) {
	job, err := Decode(text)
	id := ""
	if job != nil {
		id = job.ID
	}
	if err != nil {
		fmt.Fprintf(log, "ampwalk: line %d (id %q): %v\n", line, id, err)
		return &Response{ID: id, Error: errorBody(err)}
	}
	resp, err = job.Run(ctx, log)
	if err != nil {
		fmt.Fprintf(log, "ampwalk: line %d (id %q): %v\n", line, id, err)
		return &Response{ID: id, Error: errorBody(err)}
	}
	return resp
}

// encodeLine encodes r as one JSON line (without HTML escaping, so that
// messages keep their "<" and ">").
func encodeLine(r *Response) ([]byte, error) {
	var b bytes.Buffer
	enc := json.NewEncoder(&b)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(r); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}
