package trace

import (
	"bytes"
	"encoding/binary"
	"fmt"
	"io"
	"regexp"
	"strconv"
	"strings"

	"codeberg.org/sbinet/npyio/npy"
	"codeberg.org/sbinet/npyio/npy/float16"
	"codeberg.org/sbinet/npyio/npz"
)

// NumPy .npy and .npz input. The layout is NEP 1 ("A simple file format
// for NumPy arrays", format versions 1.0 and 2.0): the magic \x93NUMPY,
// major and minor version bytes, a little-endian header length (uint16
// for 1.0, uint32 for 2.0), a Python dict literal
// {'descr': ..., 'fortran_order': ..., 'shape': (...), } padded with
// spaces and ended by '\n', then the array's bytes. The array is decoded
// by codeberg.org/sbinet/npyio; this file checks the header first, so
// that a damaged file is refused with a located reason instead of
// reaching the library (which trusts its input), and picks the column.

// npyHeaderMax bounds the header dictionary (NumPy writes under 200
// bytes for a numeric array; 1 MiB leaves room for any writer).
const npyHeaderMax = 1 << 20

// npyDict matches the header dictionary as NumPy writes it (keys in
// sorted order, a trailing ", " before the closing brace), which is the
// layout npyio parses.
var npyDict = regexp.MustCompile(`^\{'descr': '([^']*)', 'fortran_order': (True|False), 'shape': \(([0-9, ]*)\), \} *\n$`)

// npyDescr matches the numeric dtypes read: byte order '<', '>' or '|'
// (not applicable, for one-byte types), kind i, u or f, item size.
var npyDescr = regexp.MustCompile(`^([<>|])([iuf])([0-9]+)$`)

// npyArray is a validated header: where the data start, the dtype, the
// shape as rows × columns (columns 1 for a 1-D array) and the order.
type npyArray struct {
	descr      string
	itemSize   int
	rows, cols int
	dims       int
	fortran    bool
	dataStart  int64
}

// parseNPYHeader checks the header of the NPY bytes in c.
func parseNPYHeader(c container, cfg config) (npyArray, error) {
	var a npyArray
	pre, err := c.at(0, 10, "NPY magic and version")
	if err != nil {
		return a, err
	}
	if !bytes.Equal(pre[:6], npy.Magic[:]) {
		return a, c.fail(0, ErrMalformed, fmt.Sprintf("NPY magic bytes %s, want \"\\x93NUMPY\"", quoteField(pre[:6])))
	}
	var hlen int64
	start := int64(10)
	switch pre[6] {
	case 1:
		hlen = int64(binary.LittleEndian.Uint16(pre[8:10]))
	case 2:
		b, err := c.at(8, 4, "NPY 2.0 header length")
		if err != nil {
			return a, err
		}
		hlen, start = int64(binary.LittleEndian.Uint32(b)), 12
	case 3:
		return a, c.fail(6, ErrUnsupported, "NPY format version 3.0 (UTF-8 field names); save with numpy.save as version 1.0 or 2.0")
	default:
		return a, c.fail(6, ErrMalformed, fmt.Sprintf("NPY format version %d.%d, want 1.0 or 2.0", pre[6], pre[7]))
	}
	if hlen > npyHeaderMax {
		return a, c.fail(8, ErrMalformed, fmt.Sprintf("NPY header length %d, more than %d", hlen, npyHeaderMax))
	}
	hdr, err := c.at(start, hlen, "NPY header")
	if err != nil {
		return a, err
	}
	m := npyDict.FindSubmatch(hdr)
	if m == nil {
		return a, c.fail(start, ErrMalformed, fmt.Sprintf("NPY header %s is not the dictionary NumPy writes ({'descr': ..., 'fortran_order': ..., 'shape': (...), } then '\\n')", quoteField(bytes.TrimRight(hdr, " \n"))))
	}
	a.dataStart = start + hlen
	a.descr, a.fortran = string(m[1]), string(m[2]) == "True"
	d := npyDescr.FindStringSubmatch(a.descr)
	size := 0
	if d != nil {
		size, _ = strconv.Atoi(d[3])
	}
	switch {
	case d == nil:
		return a, c.fail(start, ErrUnsupported, fmt.Sprintf("dtype %q: only integer (i1–i8, u1–u8) and floating-point (f2, f4, f8) arrays are read%s", a.descr, dtypeHint(a.descr)))
	case d[2] == "f" && size != 2 && size != 4 && size != 8,
		d[2] != "f" && size != 1 && size != 2 && size != 4 && size != 8:
		return a, c.fail(start, ErrUnsupported, fmt.Sprintf("dtype %q: %d-byte %s values are not read (f2, f4, f8, i1–i8, u1–u8 are)", a.descr, size, map[string]string{"f": "floating-point", "i": "integer", "u": "unsigned"}[d[2]]))
	case d[1] == "|" && size != 1:
		return a, c.fail(start, ErrMalformed, fmt.Sprintf("dtype %q: byte order '|' is for one-byte types only", a.descr))
	}
	a.itemSize = size
	var shape []uint64
	for tok := range strings.SplitSeq(string(m[3]), ",") {
		tok = strings.TrimSpace(tok)
		if tok == "" {
			continue
		}
		v, err := strconv.ParseUint(tok, 10, 63)
		if err != nil {
			return a, c.fail(start, ErrMalformed, fmt.Sprintf("NPY shape entry %q", tok))
		}
		shape = append(shape, v)
	}
	a.dims = len(shape)
	switch len(shape) {
	case 0:
		return a, c.fail(start, ErrUnsupported, "a 0-dimensional array holds a single value, not a series")
	case 1:
		shape = append(shape, 1)
	case 2:
	default:
		return a, c.fail(start, ErrUnsupported, fmt.Sprintf("a %d-dimensional array; save one series (1-D) or a table (2-D, one column per channel)", len(shape)))
	}
	if shape[0] > uint64(cfg.maxN) && shape[1] > 0 {
		return a, tooMany(c.name, shape[0], cfg)
	}
	if shape[1] > uint64(cfg.maxN) {
		return a, c.fail(start, ErrTooLarge, fmt.Sprintf("%d columns", shape[1]))
	}
	a.rows, a.cols = int(shape[0]), int(shape[1])
	want := int64(a.rows) * int64(a.cols) * int64(size) // < 2^27 · 2^27 · 8 = 2^57
	switch have := c.size - a.dataStart; {
	case have < want:
		return a, c.fail(c.size, ErrTruncated, fmt.Sprintf("the %s array of shape %s needs %d bytes of data, the file holds %d", a.descr, shapeText(a), want, have))
	case have > want:
		return a, c.fail(a.dataStart+want, ErrMalformed, fmt.Sprintf("%d bytes after the data of the %s array of shape %s", have-want, a.descr, shapeText(a)))
	}
	return a, nil
}

// dtypeHint says what to do about common non-numeric dtypes.
func dtypeHint(descr string) string {
	switch {
	case strings.Contains(descr, "c"):
		return "; save the real part or the magnitude (numpy.abs)"
	case strings.HasSuffix(descr, "b1"):
		return "; booleans are not a trace"
	case strings.Contains(descr, "O"), strings.Contains(descr, "U"), strings.Contains(descr, "S"):
		return "; objects and strings are not samples"
	}
	return ""
}

func shapeText(a npyArray) string {
	if a.dims == 1 {
		return fmt.Sprintf("(%d,)", a.rows)
	}
	return fmt.Sprintf("(%d, %d)", a.rows, a.cols)
}

// decodeNPY reads the array of c through npyio and returns its elements
// as float64 in storage order. Integers convert exactly up to 2^53, as
// they do when printed and read back from text.
func decodeNPY(c container, a npyArray) (vals []float64, err error) {
	defer func() {
		if p := recover(); p != nil { // npyio trusts its input; the header was checked, so this is a bug
			vals, err = nil, c.fail(a.dataStart, ErrMalformed, fmt.Sprintf("the NPY decoder failed: %v", p))
		}
	}()
	rd, err := npy.NewReader(io.NewSectionReader(c.r, 0, c.size))
	if err != nil {
		return nil, c.fail(0, ErrMalformed, err.Error())
	}
	var arr npy.Array
	if err := rd.Read(&arr); err != nil {
		return nil, c.fail(a.dataStart, ErrMalformed, err.Error())
	}
	switch d := arr.Data().(type) {
	case []float64:
		return d, nil
	case []float32:
		return convert(d), nil
	case []float16.Num:
		out := make([]float64, len(d))
		for i, v := range d {
			out[i] = float64(v.Float32())
		}
		return out, nil
	case []int8:
		return convert(d), nil
	case []int16:
		return convert(d), nil
	case []int32:
		return convert(d), nil
	case []int64:
		return convert(d), nil
	case []uint8:
		return convert(d), nil
	case []uint16:
		return convert(d), nil
	case []uint32:
		return convert(d), nil
	case []uint64:
		return convert(d), nil
	default:
		return nil, c.fail(a.dataStart, ErrUnsupported, fmt.Sprintf("dtype %q decoded as %T", a.descr, d))
	}
}

// number is the element types of the arrays read.
type number interface {
	~int8 | ~int16 | ~int32 | ~int64 | ~uint8 | ~uint16 | ~uint32 | ~uint64 | ~float32 | ~float64
}

func convert[T number](d []T) []float64 {
	out := make([]float64, len(d))
	for i, v := range d {
		out[i] = float64(v)
	}
	return out
}

// column returns column j (0-based) of the decoded array.
func (a npyArray) column(all []float64, j int) []float64 {
	if a.cols == 1 {
		return all
	}
	out := make([]float64, a.rows)
	for i := range out {
		if a.fortran {
			out[i] = all[j*a.rows+i]
		} else {
			out[i] = all[i*a.cols+j]
		}
	}
	return out
}

// readNPYArray reads one array from c, choosing its column by cfg.
func readNPYArray(c container, cfg config, how string) (Trace, error) {
	a, err := parseNPYHeader(c, cfg)
	if err != nil {
		return Trace{}, err
	}
	ch, err := pickNumbered(a.cols, cfg, c.name, "column", "the columns of a NumPy array", how)
	if err != nil {
		return Trace{}, err
	}
	all, err := decodeNPY(c, a)
	if err != nil {
		return Trace{}, err
	}
	tr := Trace{Values: a.column(all, ch.index), ColumnIndex: ch.index + 1, Columns: a.cols}
	if ch.warning != "" {
		tr.Warnings = append(tr.Warnings, ch.warning)
	}
	return tr, nil
}

// readNPY reads a .npy file.
func readNPY(c container, cfg config) (Trace, error) {
	return readNPYArray(c, cfg, "--column N")
}

// readNPZ reads one member of a .npz archive (a zip of .npy files, as
// numpy.savez and numpy.savez_compressed write it), opened through
// npyio's npz reader. Options.Column: "x" or "x.npy" names the member,
// "x/2" takes its column 2; a bare number is a column of the only member.
func readNPZ(c container, cfg config) (Trace, error) {
	zr, err := npz.NewReader(c.r, c.size)
	if err != nil {
		return Trace{}, &Error{File: c.name, Err: ErrMalformed, Detail: "NPZ (zip) archive: " + strings.TrimPrefix(err.Error(), "npz: could not create zip reader: ")}
	}
	keys := zr.Keys()
	var names []string // member names without ".npy", in archive order
	var files []string
	for _, k := range keys {
		if strings.HasSuffix(k, ".npy") {
			names = append(names, strings.TrimSuffix(k, ".npy"))
			files = append(files, k)
		}
	}
	if len(names) == 0 {
		return Trace{}, &Error{File: c.name, Err: ErrEmpty, Detail: fmt.Sprintf("the archive holds no .npy member (%d other entries)", len(keys))}
	}
	member, col := -1, ""
	spec := cfg.colName
	if spec == "" && cfg.colIndex > 0 {
		spec = strconv.Itoa(cfg.colIndex)
	}
	find := func(s string) int {
		for i, n := range names {
			if n == s || files[i] == s {
				return i
			}
		}
		return -1
	}
	switch {
	case spec == "":
	case find(spec) >= 0:
		member = find(spec)
	case strings.Contains(spec, "/") && find(spec[:strings.LastIndex(spec, "/")]) >= 0:
		k := strings.LastIndex(spec, "/")
		member, col = find(spec[:k]), spec[k+1:]
	case len(names) == 1 && isDigits(spec):
		member, col = 0, spec
	default:
		pc, err := pickChannel(names, config{colName: spec}, c.name, "array", "--column NAME")
		if err != nil {
			return Trace{}, err
		}
		member = pc.index
	}
	var warnings []string
	if member < 0 {
		pc, _ := pickChannel(names, config{}, c.name, "array", "--column NAME")
		member = pc.index
		if pc.warning != "" {
			warnings = append(warnings, pc.warning)
		}
	}
	rc, err := zr.Open(files[member])
	if err != nil {
		return Trace{}, &Error{File: c.name, Member: names[member], Err: ErrMalformed, Detail: err.Error()}
	}
	defer rc.Close()
	inner := config{maxN: cfg.maxN}
	if col != "" {
		if !isDigits(col) {
			return Trace{}, &Error{File: c.name, Member: names[member], Err: ErrNoColumn,
				Detail: fmt.Sprintf("column %q: the columns of a NumPy array are chosen by number", col)}
		}
		inner.colIndex, _ = strconv.Atoi(col)
		if inner.colIndex < 1 {
			return Trace{}, &Error{File: c.name, Member: names[member], Err: ErrNoColumn, Detail: "columns are numbered from 1"}
		}
	}
	mc, err := loadContainer(rc, c.name, inner)
	if err != nil {
		e := err.(*Error)
		e.Member = names[member]
		if e.Err != ErrTruncated && e.Err != ErrTooLarge {
			e.Detail, e.Err = "NPZ member cannot be decompressed: "+e.Err.Error(), ErrMalformed
		}
		return Trace{}, e
	}
	tr, err := readNPYArray(mc, inner, fmt.Sprintf("--column %s/N", names[member]))
	if err != nil {
		if e, ok := err.(*Error); ok {
			e.Member = names[member]
		}
		return Trace{}, err
	}
	tr.Column = names[member]
	tr.Warnings = append(warnings, tr.Warnings...)
	return tr, nil
}
