package trace

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"path"
	"strconv"
	"strings"
)

// Binary containers (NPY, NPZ, TDMS, WAV): how they are recognised, the
// random-access byte source they are parsed from, and what the readers
// share (located errors, channel choice, the NaN scan).

// magicLen is how many leading bytes format detection looks at.
const magicLen = 12

// containerExt maps a file-name extension to the container it promises.
var containerExt = map[string]Format{".npy": FormatNPY, ".npz": FormatNPZ, ".tdms": FormatTDMS, ".wav": FormatWAV}

// magicFormat returns the container whose magic bytes start b, or "".
// NPY: \x93NUMPY (NEP 1, "A simple file format for NumPy arrays");
// NPZ: a zip local-file header PK\x03\x04 or an empty archive's end
// record PK\x05\x06 (PKWARE APPNOTE 4.3.7, 4.3.16); TDMS: the segment tag
// "TDSm" (NI, "TDMS File Format Internal Structure"); WAV: "RIFF" size
// "WAVE" (Microsoft/IBM RIFF, 1991), or the big-endian and 64-bit
// variants RIFX and RF64, which the WAV reader names as unsupported.
func magicFormat(b []byte) Format {
	switch {
	case bytes.HasPrefix(b, []byte("\x93NUMPY")):
		return FormatNPY
	case bytes.HasPrefix(b, []byte("PK\x03\x04")), bytes.HasPrefix(b, []byte("PK\x05\x06")):
		return FormatNPZ
	case bytes.HasPrefix(b, []byte("TDSm")), bytes.HasPrefix(b, []byte("TDSh")):
		return FormatTDMS
	case len(b) >= 12 && (bytes.HasPrefix(b, []byte("RIFF")) || bytes.HasPrefix(b, []byte("RIFX")) || bytes.HasPrefix(b, []byte("RF64"))) && string(b[8:12]) == "WAVE":
		return FormatWAV
	}
	return ""
}

// detect chooses the reader for FormatAuto from the first bytes b of the
// (decompressed) input and the source name: a container's magic bytes
// win; a container extension without them is an error (a damaged or
// misnamed file is reported, not parsed as text); anything else is text.
func detect(b []byte, name string) (Format, error) {
	if f := magicFormat(b); f != "" {
		return f, nil
	}
	ext := strings.ToLower(path.Ext(strings.TrimSuffix(strings.ToLower(name), ".gz")))
	if f, ok := containerExt[ext]; ok {
		return "", &Error{File: name, Err: ErrMalformed, Offset: 0, HasOffset: true,
			Detail: fmt.Sprintf("the name ends in %s but the file does not start with the %s magic bytes (it starts with %s); use --input-format to read it as something else", ext, strings.ToUpper(string(f)), quoteField(b))}
	}
	return FormatCSV, nil
}

// container is the random-access byte source of a binary container.
type container struct {
	r    io.ReaderAt
	size int64
	name string
}

// maxContainerBytes bounds the bytes of a binary container that is held
// in memory (read from a stream or decompressed): 16 bytes per sample of
// the MaxSamples limit plus 1 MiB of headers, which leaves room for a
// second channel of float64 beside the chosen one.
func maxContainerBytes(cfg config) int64 { return 16*int64(cfg.maxN) + 1<<20 }

// loadContainer reads a stream whole into memory (at most
// maxContainerBytes), for containers that arrive compressed or on a pipe.
func loadContainer(r io.Reader, name string, cfg config) (container, error) {
	limit := maxContainerBytes(cfg)
	b, err := io.ReadAll(io.LimitReader(r, limit+1))
	if err != nil {
		if errors.Is(err, io.ErrUnexpectedEOF) {
			return container{}, &Error{File: name, Err: ErrTruncated, Detail: "compressed stream ends early (file cut off?)"}
		}
		return container{}, &Error{File: name, Err: err}
	}
	if int64(len(b)) > limit {
		return container{}, &Error{File: name, Err: ErrTooLarge, Limit: cfg.maxN,
			Detail: fmt.Sprintf("more than %d bytes read from a stream or a compressed file; give the uncompressed file by its path", limit)}
	}
	return container{r: bytes.NewReader(b), size: int64(len(b)), name: name}, nil
}

// at reads exactly n bytes at offset off; what names the part for the
// error when the file ends first.
func (c container) at(off int64, n int64, what string) ([]byte, error) {
	if off < 0 || n < 0 || off > c.size || n > c.size-off {
		have := max(c.size-off, 0)
		return nil, c.fail(off, ErrTruncated, fmt.Sprintf("%s needs %d bytes, the file has %d left", what, n, have))
	}
	b := make([]byte, n)
	if _, err := c.r.ReadAt(b, off); err != nil && !(err == io.EOF && int64(len(b)) == n) {
		return nil, &Error{File: c.name, Offset: off, HasOffset: true, Err: err}
	}
	return b, nil
}

// fail returns an *Error located at byte off of the container.
func (c container) fail(off int64, sentinel error, detail string) *Error {
	return &Error{File: c.name, Offset: off, HasOffset: true, Err: sentinel, Detail: detail}
}

// choice is a resolved channel: its 0-based index and a warning when it
// was chosen automatically among several.
type choice struct {
	index   int
	warning string
}

// pickChannel chooses one of names (the channels, members or columns of
// a container, in file order) by cfg: a 1-based index, a name (exact,
// then ignoring case), or, with neither, the only one or else the first
// with a warning. what is the singular noun ("channel"), flag how the
// user chooses ("--column group/channel").
func pickChannel(names []string, cfg config, file, what, how string) (choice, error) {
	list := func() string {
		shown := names
		more := ""
		if len(shown) > 8 {
			shown, more = shown[:8], fmt.Sprintf(" and %d more", len(names)-8)
		}
		q := make([]string, len(shown))
		for i, n := range shown {
			q[i] = strconv.Quote(n)
		}
		return strings.Join(q, ", ") + more
	}
	switch {
	case len(names) == 0:
		return choice{}, &Error{File: file, Err: ErrEmpty, Detail: fmt.Sprintf("the file holds no %s with numeric data", what)}
	case cfg.colIndex > 0:
		if cfg.colIndex > len(names) {
			return choice{}, &Error{File: file, Err: ErrNoColumn,
				Detail: fmt.Sprintf("%s %d: the file has %d (%s)", what, cfg.colIndex, len(names), list())}
		}
		return choice{index: cfg.colIndex - 1}, nil
	case cfg.colName != "":
		for i, n := range names {
			if n == cfg.colName {
				return choice{index: i}, nil
			}
		}
		for i, n := range names {
			if strings.EqualFold(n, cfg.colName) {
				return choice{index: i}, nil
			}
		}
		return choice{}, &Error{File: file, Err: ErrNoColumn,
			Detail: fmt.Sprintf("%s %q: the file has %s", what, cfg.colName, list())}
	case len(names) > 1:
		return choice{index: 0, warning: fmt.Sprintf("%d %ss (%s); read %q (choose with %s)", len(names), what, list(), names[0], how)}, nil
	}
	return choice{}, nil
}

// pickNumbered chooses one of n unnamed channels (numbered from 1) by
// cfg; plural names them in the message refusing a name ("WAV channels").
func pickNumbered(n int, cfg config, file, what, plural, how string) (choice, error) {
	if cfg.colName != "" {
		return choice{}, &Error{File: file, Err: ErrNoColumn,
			Detail: fmt.Sprintf("%q: %s are chosen by number, 1 to %d", cfg.colName, plural, n)}
	}
	names := make([]string, n)
	for i := range names {
		names[i] = strconv.Itoa(i + 1)
	}
	return pickChannel(names, cfg, file, what, how)
}

// scanFinite locates the non-finite values of x for finish.
func scanFinite(x []float64) badInfo {
	var bad badInfo
	for i, v := range x {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			if bad.count == 0 {
				bad.sample, bad.text = i+1, strconv.FormatFloat(v, 'g', -1, 64)
			}
			bad.count++
		}
	}
	return bad
}

// finishContainer applies the NaN policy and the length and constancy
// checks to the values a container reader produced.
func finishContainer(tr Trace, cfg config) (Trace, error) {
	if len(tr.Values) == 0 {
		return Trace{}, &Error{File: tr.Source, Err: ErrEmpty, Detail: "the chosen array or channel holds no samples"}
	}
	if err := finish(&tr, nil, nil, scanFinite(tr.Values), cfg); err != nil {
		return Trace{}, err
	}
	return tr, nil
}

// tooMany is the ErrTooLarge of a container whose chosen channel holds n
// samples.
func tooMany(file string, n uint64, cfg config) error {
	return &Error{File: file, Err: ErrTooLarge, Count: int(min(n, math.MaxInt)), Limit: cfg.maxN,
		Detail: fmt.Sprintf("%d samples, more than the MaxSamples limit %d", n, cfg.maxN)}
}

// readContainer dispatches to the reader of format.
func readContainer(c container, format Format, cfg config) (Trace, error) {
	var tr Trace
	var err error
	switch format {
	case FormatNPY:
		tr, err = readNPY(c, cfg)
	case FormatNPZ:
		tr, err = readNPZ(c, cfg)
	case FormatTDMS:
		tr, err = readTDMS(c, cfg)
	default:
		tr, err = readWAV(c, cfg)
	}
	if err != nil {
		return Trace{}, err
	}
	tr.Source, tr.Format = c.name, format
	return finishContainer(tr, cfg)
}
