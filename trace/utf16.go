package trace

import (
	"bufio"
	"io"
	"unicode/utf16"
	"unicode/utf8"
)

// decodeUTF16 returns r unchanged unless it starts with a UTF-16
// byte-order mark (FF FE little-endian, FE FF big-endian, as written by
// spreadsheet "Unicode text" exports); then it returns a reader of the
// same text in UTF-8 without the mark.
func decodeUTF16(r io.Reader) io.Reader {
	br, ok := r.(*bufio.Reader)
	if !ok {
		br = bufio.NewReader(r)
	}
	bom, _ := br.Peek(2)
	switch {
	case len(bom) == 2 && bom[0] == 0xff && bom[1] == 0xfe:
		br.Discard(2)
		return &utf16Reader{r: br, little: true}
	case len(bom) == 2 && bom[0] == 0xfe && bom[1] == 0xff:
		br.Discard(2)
		return &utf16Reader{r: br}
	}
	return br
}

type utf16Reader struct {
	r      *bufio.Reader
	little bool
	out    []byte // decoded bytes not yet returned
	err    error
}

func (u *utf16Reader) unit() (uint16, error) {
	a, err := u.r.ReadByte()
	if err != nil {
		return 0, err
	}
	b, err := u.r.ReadByte()
	if err != nil {
		if err == io.EOF {
			err = io.ErrUnexpectedEOF
		}
		return 0, err
	}
	if u.little {
		return uint16(a) | uint16(b)<<8, nil
	}
	return uint16(b) | uint16(a)<<8, nil
}

func (u *utf16Reader) Read(p []byte) (int, error) {
	for len(u.out) < len(p) && u.err == nil {
		c, err := u.unit()
		if err != nil {
			u.err = err
			break
		}
		r := rune(c)
		if utf16.IsSurrogate(r) {
			c2, err := u.unit()
			if err != nil {
				u.err = err
				r = utf8.RuneError
			} else {
				r = utf16.DecodeRune(r, rune(c2))
			}
		}
		u.out = utf8.AppendRune(u.out, r)
	}
	n := copy(p, u.out)
	u.out = u.out[:copy(u.out, u.out[n:])]
	if n == 0 && u.err != nil {
		return 0, u.err
	}
	return n, nil
}
