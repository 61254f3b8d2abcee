package trace

import (
	"bytes"
	"io"

	"github.com/tracesift/tracesift/internal/echo"
)

// Binary detection on the first block of text input.
const (
	// sniffLen is the size of the first block examined.
	sniffLen = 4096
)

// The details of ErrBinary.
const (
	rawHint   = "for raw samples use format f32le or f64le"
	utf16Hint = "every other byte is NUL, as in UTF-16 text without a byte-order mark; save it as UTF-8"
)

// sniff reads the first block of the text stream r and fails with
// ErrBinary when echo.Binary calls the block binary. Otherwise it returns a reader of the whole stream: the
// block, then the rest of r, or the error that reading the block met (so
// that the line reader reports it where it occurs).
func sniff(r io.Reader, name string) (io.Reader, error) {
	block := make([]byte, sniffLen)
	n, err := readBlock(r, block)
	block = block[:n]
	if d := binaryDetail(block, err != nil); d != "" {
		return nil, &Error{File: name, Err: ErrBinary, Detail: d}
	}
	switch err {
	case nil:
		return io.MultiReader(bytes.NewReader(block), r), nil
	case io.EOF:
		return bytes.NewReader(block), nil
	}
	return io.MultiReader(bytes.NewReader(block), errReader{err}), nil
}

// readBlock fills b from r and returns the bytes read and the error that
// stopped it short (io.EOF at the end of the stream), nil when b is full.
func readBlock(r io.Reader, b []byte) (int, error) {
	n := 0
	for n < len(b) {
		k, err := r.Read(b[n:])
		n += k
		if err != nil {
			return n, err
		}
	}
	return n, nil
}

type errReader struct{ err error }

func (e errReader) Read([]byte) (int, error) { return 0, e.err }

// binaryDetail returns the ErrBinary detail for the first block b of a
// text stream, or "" when b looks like text (echo.Binary; final says the
// stream ends with b).
func binaryDetail(b []byte, final bool) string {
	switch {
	case !echo.Binary(b, final):
		return ""
	case bytes.IndexByte(b, 0) >= 0 && utf16Like(b):
		return utf16Hint
	}
	return rawHint
}

// utf16Like reports whether b reads as mostly-ASCII text in UTF-16
// without a byte-order mark: at least 8 bytes, and in at least 90% of the
// byte pairs one byte (the same one of each pair throughout) NUL and the
// other printable ASCII or a line end.
func utf16Like(b []byte) bool {
	pairs := len(b) / 2
	if pairs < 4 {
		return false
	}
	for nul := range 2 { // 0: big-endian, 1: little-endian
		ascii := 0
		for i := 0; i+1 < len(b); i += 2 {
			z, c := b[i+nul], b[i+1-nul]
			if z == 0 && (c >= 0x20 && c < 0x7f || c == '\t' || c == '\n' || c == '\r') {
				ascii++
			}
		}
		if ascii*10 >= pairs*9 {
			return true
		}
	}
	return false
}
