package trace

import (
	"bufio"
	"bytes"
	"errors"
	"io"
)

// lineSplitter returns a bufio.SplitFunc that ends lines at "\n", "\r\n"
// or a lone "\r" (old Mac exports), without the terminator. After the first
// lone "\r" it searches for "\r" first, so CR-only files stay linear-time.
func lineSplitter() bufio.SplitFunc {
	crMode := false
	return func(data []byte, atEOF bool) (int, []byte, error) {
		if len(data) == 0 {
			return 0, nil, nil
		}
		var lf, cr int
		if crMode {
			cr = bytes.IndexByte(data, '\r')
			lim := len(data)
			if cr >= 0 {
				lim = cr
			}
			lf = bytes.IndexByte(data[:lim], '\n')
		} else {
			lf = bytes.IndexByte(data, '\n')
			lim := len(data)
			if lf >= 0 {
				lim = lf
			}
			cr = bytes.IndexByte(data[:lim], '\r')
		}
		switch {
		case cr >= 0 && (lf < 0 || cr < lf):
			if cr+1 < len(data) {
				if data[cr+1] == '\n' {
					return cr + 2, data[:cr], nil
				}
				crMode = true
				return cr + 1, data[:cr], nil
			}
			if !atEOF {
				return 0, nil, nil // need one more byte to tell "\r\n" from "\r"
			}
			return cr + 1, data[:cr], nil
		case lf >= 0:
			return lf + 1, data[:lf], nil
		}
		if atEOF {
			return len(data), data, nil
		}
		return 0, nil, nil
	}
}

// lineReader yields numbered lines of a text stream, with a leading UTF-8
// byte-order mark removed, and turns scanner failures into *Error.
type lineReader struct {
	name string
	sc   *bufio.Scanner
	num  int // number of the line last returned
}

func newLineReader(r io.Reader, name string) *lineReader {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 0, 64<<10), MaxLineBytes)
	sc.Split(lineSplitter())
	return &lineReader{name: name, sc: sc}
}

// next returns the next line (valid until the following call) and true,
// or nil and false at the end; err is non-nil when reading failed.
func (lr *lineReader) next() ([]byte, bool, error) {
	if !lr.sc.Scan() {
		if err := lr.sc.Err(); err != nil {
			return nil, false, lr.wrap(err)
		}
		return nil, false, nil
	}
	lr.num++
	b := lr.sc.Bytes()
	if lr.num == 1 {
		b = bytes.TrimPrefix(b, []byte("\xef\xbb\xbf"))
	}
	return b, true, nil
}

func (lr *lineReader) wrap(err error) error {
	e := &Error{File: lr.name, Line: lr.num + 1, Err: err}
	switch {
	case errors.Is(err, bufio.ErrTooLong):
		e.Err = ErrLineTooLong
		e.Detail = "longer than 16 MiB"
	case errors.Is(err, io.ErrUnexpectedEOF):
		e.Err = ErrTruncated
		e.Detail = "the stream ends early (file cut off?)"
	}
	return e
}
