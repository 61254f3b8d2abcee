package trace

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"strings"
)

// Trace is one validated series of samples with what the input said
// about it.
type Trace struct {
	// Values are the samples, all finite, at least MinLength of them and
	// not all equal.
	Values []float64
	// Interval is the sample interval in the units of the time column:
	// (t_last − t_0)/(n − 1) for even sampling, the median step for
	// uneven sampling, 0 when there is no usable time column (none, not
	// strictly increasing, or fewer than 2 samples).
	Interval float64
	// Uneven reports that some time step differs from the median step by
	// more than UnevenTolerance of it plus the rounding of the printed
	// stamps (the package documentation gives the rule; Warnings the
	// range of steps).
	Uneven bool
	// TimeColumn is the 1-based time column, 0 when there is none.
	TimeColumn int
	// TimeUnit is the unit given in the time column's header, e.g. "s".
	TimeUnit string
	// Column and Unit are the value column's header name and unit
	// ("Id (A)" → "Id", "A"); empty without a header.
	Column, Unit string
	// ColumnIndex is the 1-based value column (1 for raw binary).
	ColumnIndex int
	// Columns is the number of columns of the table (1 for raw binary).
	Columns int
	// Source names the input: the path, "stdin", "input" or Options.Name.
	Source string
	// Format is what was read: FormatCSV for any text, or the raw format.
	Format Format
	// FirstLine is the line number of the first data row of text input
	// (0 for raw binary).
	FirstLine int
	// NonFinite counts the non-finite or missing values that NaNDrop
	// removed or NaNInterpolate filled.
	NonFinite int
	// Warnings are one-line notes on choices made and oddities tolerated
	// (column chosen among several, uneven time steps, values dropped,
	// lines ignored). They never repeat the source name.
	Warnings []string
}

// ReadFile reads the trace stored at path; "-" means standard input.
// Gzip compression is recognised by its magic bytes (a ".gz" name whose
// content is not compressed is read as plain, with a warning). See Read
// for the rest.
func ReadFile(path string, opts Options) (Trace, error) {
	name := opts.Name
	if path == "-" {
		if name == "" {
			name = "stdin"
		}
		return read(os.Stdin, name, -1, nil, false, opts)
	}
	if name == "" {
		name = path
	}
	f, err := os.Open(path)
	if err != nil {
		return Trace{}, &Error{File: name, Err: err}
	}
	defer f.Close()
	size := int64(-1)
	if st, err := f.Stat(); err == nil {
		if st.IsDir() {
			return Trace{}, &Error{File: name, Err: errIsDir}
		}
		if st.Mode().IsRegular() {
			size = st.Size()
		}
	}
	var ra io.ReaderAt
	if size >= 0 {
		ra = f
	}
	return read(f, name, size, ra, strings.HasSuffix(strings.ToLower(path), ".gz"), opts)
}

// Read reads one trace from r according to opts and validates it.
//
// Text (FormatAuto or FormatCSV) is parsed as described in the package
// documentation; raw formats hold bare little-endian samples. Input that
// starts with the gzip magic bytes (1f 8b 08) is decompressed first,
// whatever the format. UTF-8 and UTF-16 text with a byte-order mark are
// accepted.
//
// Validation, in this order: values must be finite (or are handled by
// opts.NaN), not all equal (ErrConstant), and at least opts.MinLength
// long (ErrTooShort). Every failure is an *Error naming the source and,
// where it applies, the line and column.
func Read(r io.Reader, opts Options) (Trace, error) {
	name := opts.Name
	if name == "" {
		name = "input"
	}
	size := int64(-1)
	var ra io.ReaderAt
	switch v := r.(type) {
	case *bytes.Reader:
		size = int64(v.Len())
		if pos, err := v.Seek(0, io.SeekCurrent); err == nil {
			ra = io.NewSectionReader(v, pos, size)
		}
	case interface{ Len() int }: // strings.Reader, bytes.Buffer
		size = int64(v.Len())
	case *os.File:
		if st, err := v.Stat(); err == nil && st.Mode().IsRegular() {
			if pos, err := v.Seek(0, io.SeekCurrent); err == nil {
				size = st.Size() - pos
				ra = io.NewSectionReader(v, pos, size)
			}
		}
	}
	return read(r, name, size, ra, false, opts)
}

// read reads one trace from r (size bytes when known, else -1); ra, when
// not nil, gives random access to the same bytes from where r starts, so
// that a binary container need not be copied into memory.
func read(r io.Reader, name string, size int64, ra io.ReaderAt, gzName bool, opts Options) (Trace, error) {
	cfg, err := opts.resolve(name)
	if err != nil {
		return Trace{}, err
	}
	br := bufio.NewReaderSize(r, 64<<10)
	var warnings []string
	magic, err := br.Peek(3)
	if err != nil && err != io.EOF && err != bufio.ErrBufferFull {
		return Trace{}, &Error{File: name, Err: err}
	}
	src := io.Reader(br)
	gzipped := bytes.Equal(magic, []byte{0x1f, 0x8b, 0x08})
	if gzipped {
		zr, err := gzip.NewReader(br)
		if err != nil {
			if err == io.ErrUnexpectedEOF || err == io.EOF {
				return Trace{}, &Error{File: name, Err: ErrTruncated, Detail: "gzip header cut off"}
			}
			return Trace{}, &Error{File: name, Err: err}
		}
		defer zr.Close()
		src, size = bufio.NewReaderSize(zr, 64<<10), -1
	} else if gzName {
		warnings = append(warnings, "the name ends in .gz but the data are not gzip-compressed; read as they are")
	}
	format := cfg.format
	if format == FormatAuto {
		head, err := src.(*bufio.Reader).Peek(magicLen)
		if err != nil && err != io.EOF && err != bufio.ErrBufferFull {
			if errors.Is(err, io.ErrUnexpectedEOF) {
				return Trace{}, &Error{File: name, Err: ErrTruncated, Detail: "compressed stream ends early (file cut off?)"}
			}
			return Trace{}, &Error{File: name, Err: err}
		}
		if format, err = detect(head, name); err != nil {
			return Trace{}, err
		}
	}
	var tr Trace
	switch format {
	case FormatNPY, FormatNPZ, FormatTDMS, FormatWAV:
		var c container
		if !gzipped && ra != nil && size >= 0 {
			c = container{r: ra, size: size, name: name}
		} else if c, err = loadContainer(src, name, cfg); err != nil {
			return Trace{}, err
		}
		tr, err = readContainer(c, format, cfg)
	case FormatF32LE, FormatF64LE:
		tr, err = readRaw(src, name, size, cfg)
	default:
		src = decodeUTF16(src)
		if src, err = sniff(src, name); err == nil {
			p := &textReader{name: name, cfg: cfg, lr: newLineReader(src, name), size: size}
			tr, err = p.read()
		}
	}
	if len(warnings) > 0 {
		tr.Warnings = append(warnings, tr.Warnings...)
	}
	if err != nil {
		return Trace{}, err
	}
	return tr, nil
}

var errIsDir = errors.New("is a directory, not a trace file")

// badInfo locates the first non-finite value of the value column.
type badInfo struct {
	count        int
	line, sample int
	text         string
	column       int
	name         string
}

// finish applies the NaN policy, derives the interval from the time
// stamps (nil if none) and checks constancy and length.
func finish(tr *Trace, times []float64, res []int16, bad badInfo, cfg config) error {
	x := tr.Values
	n := len(x)
	if bad.count > 0 {
		where := &Error{File: tr.Source, Line: bad.line, Sample: bad.sample,
			Column: bad.column, Name: bad.name, Err: ErrNonFinite}
		if bad.count == n {
			where.Detail = fmt.Sprintf("all %d values are non-finite or missing, the first is %s", n, bad.text)
			return where
		}
		first := fmt.Sprintf("line %d", bad.line)
		if bad.sample > 0 {
			first = fmt.Sprintf("sample %d", bad.sample)
		}
		switch cfg.nan {
		case NaNDrop:
			k := 0
			for i, v := range x {
				if isFinite(v) {
					x[k] = v
					if times != nil {
						times[k] = times[i]
					}
					if res != nil {
						res[k] = res[i]
					}
					k++
				}
			}
			x = x[:k]
			if times != nil {
				times = times[:k]
			}
			if res != nil {
				res = res[:k]
			}
			tr.Warnings = append(tr.Warnings, fmt.Sprintf("dropped %d non-finite or missing value(s), the first at %s", bad.count, first))
		case NaNInterpolate:
			interpolate(x)
			tr.Warnings = append(tr.Warnings, fmt.Sprintf("interpolated %d non-finite or missing value(s), the first at %s", bad.count, first))
		default:
			where.Detail = bad.text + " (set --nan drop or --nan interpolate to accept such values)"
			if bad.count > 1 {
				where.Detail = fmt.Sprintf("%s, %d such values in all (set --nan drop or --nan interpolate to accept them)", bad.text, bad.count)
			}
			return where
		}
		tr.NonFinite = bad.count
		tr.Values = x
		n = len(x)
	}
	if len(times) >= 2 && !isFinite(times[len(times)-1]-times[0]) {
		tr.Warnings = append(tr.Warnings, "the time column spans more than the float64 range; no sample interval derived")
		tr.TimeColumn, tr.TimeUnit, times = 0, "", nil
	}
	if len(times) >= 2 {
		delta, uneven, lo, hi := interval(times, res)
		tr.Interval, tr.Uneven = delta, uneven
		if uneven {
			tr.Warnings = append(tr.Warnings, unevenWarning(delta, lo, hi))
		}
	}
	if n >= 2 {
		constant := true
		for _, v := range x[1:] {
			if v != x[0] {
				constant = false
				break
			}
		}
		if constant {
			return &Error{File: tr.Source, Column: bad.column, Name: bad.name, Err: ErrConstant,
				Detail: fmt.Sprintf("all %d values equal %g", n, x[0])}
		}
	}
	if n < cfg.minLen {
		return &Error{File: tr.Source, Err: ErrTooShort, Count: n, Limit: cfg.minLen,
			Detail: fmt.Sprintf("only %d %s, at least %d needed", n, plural(n, "sample"), cfg.minLen)}
	}
	return nil
}

func plural(n int, word string) string {
	if n == 1 {
		return word
	}
	return word + "s"
}

func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// interpolate fills non-finite entries of x linearly in the index between
// the nearest finite neighbours; leading and trailing runs take the
// nearest finite value. x must hold at least one finite value.
func interpolate(x []float64) {
	prev := -1
	for i, v := range x {
		if !isFinite(v) {
			continue
		}
		switch {
		case prev < 0:
			for j := 0; j < i; j++ {
				x[j] = v
			}
		case prev < i-1:
			a, b := x[prev], v
			span := float64(i - prev)
			for j := prev + 1; j < i; j++ {
				x[j] = a + (b-a)*float64(j-prev)/span
			}
		}
		prev = i
	}
	for j := prev + 1; j < len(x); j++ {
		x[j] = x[prev]
	}
}
