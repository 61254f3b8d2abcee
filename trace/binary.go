package trace

import (
	"encoding/binary"
	"fmt"
	"io"
	"math"
	"strconv"
)

// readRaw reads headerless little-endian float32 or float64 samples.
// size is the byte count when known (then the length is checked before
// reading and the slice preallocated), else -1.
func readRaw(r io.Reader, name string, size int64, cfg config) (Trace, error) {
	width := 8
	if cfg.format == FormatF32LE {
		width = 4
	}
	tr := Trace{Source: name, Format: cfg.format, ColumnIndex: 1, Columns: 1}
	if cfg.colName != "" || cfg.colIndex > 1 {
		want := cfg.colName
		if want == "" {
			want = strconv.Itoa(cfg.colIndex)
		}
		return tr, &Error{File: name, Err: ErrNoColumn,
			Detail: fmt.Sprintf("%q: raw %s input has a single column 1", want, cfg.format)}
	}
	tooLarge := func(n int64) error {
		return &Error{File: name, Err: ErrTooLarge, Count: int(min(n, math.MaxInt)), Limit: cfg.maxN,
			Detail: fmt.Sprintf("%d or more samples, more than the MaxSamples limit %d", n, cfg.maxN)}
	}
	capHint := 0
	if size >= 0 {
		if size/int64(width) > int64(cfg.maxN) {
			return tr, tooLarge(size / int64(width))
		}
		capHint = int(size / int64(width))
	}
	vals := make([]float64, 0, capHint)
	buf := make([]byte, 64<<10)
	carry := 0 // bytes of an incomplete sample kept at the start of buf
	var bad badInfo
	total := int64(0)
	for {
		k, err := io.ReadAtLeast(r, buf[carry:], 1)
		n := carry + k
		total += int64(k)
		whole := n - n%width
		if len(vals)+whole/width > cfg.maxN {
			return tr, tooLarge(int64(len(vals) + whole/width))
		}
		for i := 0; i < whole; i += width {
			var v float64
			if width == 4 {
				v = float64(math.Float32frombits(binary.LittleEndian.Uint32(buf[i:])))
			} else {
				v = math.Float64frombits(binary.LittleEndian.Uint64(buf[i:]))
			}
			if !isFinite(v) {
				if bad.count == 0 {
					bad.sample, bad.text = len(vals)+1, strconv.FormatFloat(v, 'g', -1, 64)
				}
				bad.count++
			}
			vals = append(vals, v)
		}
		carry = copy(buf, buf[whole:n])
		if err == io.EOF {
			break
		}
		if err != nil {
			if err == io.ErrUnexpectedEOF {
				return tr, &Error{File: name, Sample: len(vals) + 1, Err: ErrTruncated,
					Detail: "compressed stream ends early (file cut off?)"}
			}
			return tr, &Error{File: name, Sample: len(vals) + 1, Err: err}
		}
	}
	if carry != 0 {
		return tr, &Error{File: name, Err: ErrTruncated,
			Detail: fmt.Sprintf("%d bytes is not a whole number of %d-byte %s samples (%d byte(s) left over)", total, width, cfg.format, carry)}
	}
	if len(vals) == 0 {
		return tr, &Error{File: name, Err: ErrEmpty, Detail: "the input holds no bytes"}
	}
	tr.Values = vals
	if err := finish(&tr, nil, nil, bad, cfg); err != nil {
		return Trace{}, err
	}
	return tr, nil
}
