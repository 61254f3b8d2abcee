package trace

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"github.com/tracesift/tracesift/internal/echo"
)

// Sentinel errors. Every error returned by Read and ReadFile for bad input
// is an *Error whose Err field is one of these (or, for failures of the
// underlying reader or of gzip, the error that reader returned), so callers
// tell cases apart with errors.Is(err, trace.ErrRagged) and so on.
var (
	// ErrEmpty: the input holds no data at all (empty, or only blank and
	// comment lines).
	ErrEmpty = errors.New("no data")
	// ErrHeaderOnly: the input has a header (a line of names) but no
	// numeric rows.
	ErrHeaderOnly = errors.New("header but no data rows")
	// ErrNotNumeric: a field that must hold a number does not parse as one,
	// or no line of the input is numeric.
	ErrNotNumeric = errors.New("not a number")
	// ErrBinary: text input (FormatAuto or FormatCSV) that is not text: its
	// first block holds NUL bytes or a high share of control bytes and
	// invalid UTF-8, or a line of it holds NUL bytes. Raw samples must be
	// read with FormatF32LE or FormatF64LE.
	ErrBinary = errors.New("looks binary (not delimited text)")
	// ErrNonFinite: a value is NaN, ±Inf, out of float64 range or missing
	// (empty, NA, N/A, null) and the NaN policy is NaNReject, or every
	// value is non-finite.
	ErrNonFinite = errors.New("non-finite or missing value")
	// ErrConstant: all values are equal, so the trace carries no
	// fluctuation to analyse.
	ErrConstant = errors.New("constant series")
	// ErrTooShort: fewer samples than Options.MinLength; the *Error's
	// Count and Limit hold the samples read and the minimum.
	ErrTooShort = errors.New("too short")
	// ErrRagged: a data row has a different number of fields than the
	// table.
	ErrRagged = errors.New("ragged row")
	// ErrTooLarge: more samples than Options.MaxSamples; the *Error's
	// Count and Limit hold the samples seen when reading stopped (a lower
	// bound) and the limit.
	ErrTooLarge = errors.New("too large")
	// ErrTruncated: raw binary input whose length is not a whole number
	// of samples, or a gzip stream that ends early.
	ErrTruncated = errors.New("truncated")
	// ErrNoColumn: Options.Column names no column of the table; the
	// message lists the available columns.
	ErrNoColumn = errors.New("no such column")
	// ErrLineTooLong: a text line is longer than MaxLineBytes.
	ErrLineTooLong = errors.New("line too long")
	// ErrOption: an Options field holds a value outside its documented
	// range.
	ErrOption = errors.New("invalid option")
	// ErrMalformed: a binary container (NPY, NPZ, TDMS, WAV) whose
	// structure breaks its format description: a wrong magic tag, a
	// length that runs past the end of the file or its part, an
	// inconsistent header. The *Error's Offset (and Segment, Member)
	// locate it.
	ErrMalformed = errors.New("malformed file")
	// ErrUnsupported: a well-formed binary container holding something
	// tracesift does not read: complex, string or object arrays, arrays
	// of more than two dimensions, compressed or 8-bit-float WAV, TDMS
	// DAQmx raw data.
	ErrUnsupported = errors.New("unsupported content")
)

// Error is a read failure located in the input. Its message is one line:
//
//	FILE[ member "M"][ segment S][ byte B][ line N | sample N][, column C[ ("NAME")]]: REASON[: DETAIL]
//
// for example
//
//	demo.csv line 17, column 2 ("Id"): not a number: "1.2.3"
//	run.tdms segment 3, byte 1042: malformed file: TDMS lead-in: tag "TDSx", want "TDSm"
//
// REASON is the text of Err. Line numbers count physical lines of the
// (decompressed) text from 1, including comment and blank lines; columns
// count from 1; samples of binary input count from 1 along the chosen
// channel; byte offsets count from 0 in the (decompressed) file, or in
// the NPZ member when Member is set; TDMS segments count from 1.
type Error struct {
	File   string // source name: the path, "stdin", or Options.Name
	Line   int    // 1-based text line, 0 when the error is not tied to a line
	Sample int    // 1-based sample of binary input, 0 otherwise
	Column int    // 1-based column, 0 when the error is not tied to a column
	Name   string // header name of Column, "" when there is no header
	Err    error  // one of the Err* sentinels, or an I/O or gzip error
	Detail string // the offending field, counts or a hint; may be ""
	// Member is the NPZ archive member the error is in, "" otherwise.
	Member string
	// Segment is the 1-based TDMS segment, 0 when not tied to one.
	Segment int
	// Offset is the 0-based byte offset of the fault when HasOffset is
	// set (in the file, or in Member's bytes).
	Offset    int64
	HasOffset bool
	// Count and Limit are the numbers behind ErrTooShort (samples read,
	// the minimum) and ErrTooLarge (samples seen, the maximum), so that a
	// caller can phrase its own advice; both 0 for other errors.
	Count, Limit int
}

// Error renders the one-line message described on the type.
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Member != "" {
		fmt.Fprintf(&b, " member %s", echo.Quote(e.Member))
	}
	if e.Segment > 0 {
		fmt.Fprintf(&b, " segment %d", e.Segment)
	}
	if e.HasOffset {
		if e.Segment > 0 {
			b.WriteByte(',')
		}
		fmt.Fprintf(&b, " byte %d", e.Offset)
	}
	if (e.Segment > 0 || e.HasOffset) && (e.Line > 0 || e.Sample > 0) {
		b.WriteByte(',')
	}
	switch {
	case e.Line > 0:
		b.WriteString(" line ")
		b.WriteString(strconv.Itoa(e.Line))
	case e.Sample > 0:
		b.WriteString(" sample ")
		b.WriteString(strconv.Itoa(e.Sample))
	}
	if e.Column > 0 {
		if e.Line > 0 || e.Sample > 0 {
			b.WriteByte(',')
		}
		b.WriteString(" column ")
		b.WriteString(strconv.Itoa(e.Column))
		if e.Name != "" {
			fmt.Fprintf(&b, " (%s)", echo.Quote(e.Name))
		}
	}
	b.WriteString(": ")
	if e.Err != nil {
		b.WriteString(e.Err.Error())
	}
	if e.Detail != "" {
		b.WriteString(": ")
		b.WriteString(e.Detail)
	}
	return b.String()
}

// Unwrap returns Err, so errors.Is and errors.As see the sentinel.
func (e *Error) Unwrap() error { return e.Err }

// quoteField quotes a field for an error message (see echo.Quote).
func quoteField(b []byte) string { return echo.Quote(string(b)) }
