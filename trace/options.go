package trace

import (
	"fmt"
	"strconv"
	"strings"
)

// Format names how the bytes of the input encode samples.
type Format string

// Input formats. The zero value "" means FormatAuto. Gzip compression is
// recognised for every format (see Read).
const (
	// FormatAuto recognises NPY, NPZ, TDMS and WAV by their magic bytes
	// (and refuses a file whose name ends in .npy, .npz, .tdms or .wav
	// without them), and reads everything else as delimited text with
	// the detection the package documentation describes. Raw binary is
	// never guessed.
	FormatAuto Format = "auto"
	// FormatCSV reads delimited text with the same detection as
	// FormatAuto; "text" is accepted as another spelling.
	FormatCSV Format = "csv"
	// FormatF32LE reads raw little-endian IEEE-754 float32 samples, one
	// channel, no header.
	FormatF32LE Format = "f32le"
	// FormatF64LE reads raw little-endian IEEE-754 float64 samples, one
	// channel, no header.
	FormatF64LE Format = "f64le"
	// FormatNPY reads a NumPy .npy array (format versions 1 to 3): 1-D,
	// or 2-D with Options.Column choosing the column, of any integer or
	// floating-point dtype in either byte order.
	FormatNPY Format = "npy"
	// FormatNPZ reads one array of a NumPy .npz archive (zip, stored or
	// deflated); Options.Column names the member ("x" or "x.npy"), and
	// "x/2" takes column 2 of a 2-D member.
	FormatNPZ Format = "npz"
	// FormatTDMS reads one channel of an NI TDMS file; Options.Column
	// names it as "group/channel" (or "channel" when that is unique, or
	// a 1-based index among the channels that hold numeric data).
	FormatTDMS Format = "tdms"
	// FormatWAV reads one channel of a RIFF WAVE file: PCM integer of 8,
	// 16, 24 or 32 bits or IEEE float of 32 or 64 bits; Options.Column
	// is the 1-based channel.
	FormatWAV Format = "wav"
)

// Formats lists the values Options.Format accepts (besides "" and the
// spelling "text" of FormatCSV), for help texts and usage checks.
var Formats = []Format{FormatAuto, FormatCSV, FormatF32LE, FormatF64LE, FormatNPY, FormatNPZ, FormatTDMS, FormatWAV}

// NaNPolicy says what to do with non-finite or missing values (NaN, ±Inf,
// numbers beyond float64 range, empty fields, NA, N/A, null) in the value
// column.
type NaNPolicy string

// NaN policies. The zero value "" means NaNReject.
const (
	// NaNReject fails with ErrNonFinite naming the first bad line.
	NaNReject NaNPolicy = "reject"
	// NaNDrop removes the bad samples (and their time stamps); a time
	// column then usually becomes uneven, which is reported.
	NaNDrop NaNPolicy = "drop"
	// NaNInterpolate replaces each bad sample by linear interpolation in
	// the sample index between the nearest valid neighbours; leading and
	// trailing runs take the nearest valid value.
	NaNInterpolate NaNPolicy = "interpolate"
)

// Defaults used when the corresponding Options field is zero.
const (
	// DefaultMinLength is the minimum number of samples of a usable trace.
	DefaultMinLength = 256
	// DefaultMaxSamples bounds the samples read (2^27 ≈ 1.3e8, i.e. 1 GiB
	// of float64) so that a huge or hostile input fails with ErrTooLarge
	// instead of exhausting memory.
	DefaultMaxSamples = 1 << 27
	// MaxLineBytes is the longest text line accepted; longer lines fail
	// with ErrLineTooLong.
	MaxLineBytes = 16 << 20
)

// Options controls Read and ReadFile. The zero value reads any supported
// text layout, picks the value column automatically, rejects NaN and
// requires DefaultMinLength samples.
type Options struct {
	// Column selects the value column: a 1-based index ("1" is the first
	// column, as in a spreadsheet) or a header name. A name matches the
	// whole header field ("Id (A)") or its name without unit ("Id"),
	// exactly first, then ignoring case. Empty means automatic: the only
	// non-time column, else the first one (with a warning). Raw binary
	// input has one column, so only "" and "1" are valid there. For the
	// binary containers it chooses the array column (NPY), the member
	// and column ("x", "x/2"; NPZ), the channel ("group/channel" or a
	// 1-based index; TDMS) or the 1-based channel (WAV); empty again
	// means the only one, else the first (with a warning).
	Column string
	// Format is the input encoding; "" means FormatAuto. Matching is
	// case-insensitive.
	Format Format
	// NaN is the policy for non-finite or missing values; "" means
	// NaNReject. Matching is case-insensitive.
	NaN NaNPolicy
	// MinLength is the fewest samples accepted (after NaN handling); 0
	// means DefaultMinLength. Must not be negative; 1 accepts any
	// non-empty trace.
	MinLength int
	// MaxSamples is the most samples read before failing with
	// ErrTooLarge; 0 means DefaultMaxSamples. Must not be negative.
	MaxSamples int
	// Name is the source name used in errors and Trace.Source; empty
	// means the path for ReadFile, "stdin" for ReadFile("-") and "input"
	// for Read.
	Name string
}

// config is Options after validation, with defaults filled in.
type config struct {
	format   Format
	nan      NaNPolicy
	minLen   int
	maxN     int
	colIndex int    // 1-based explicit index, 0 if none
	colName  string // explicit name, "" if none
}

func (o Options) resolve(name string) (config, error) {
	bad := func(format string, a ...any) error {
		return &Error{File: name, Err: ErrOption, Detail: fmt.Sprintf(format, a...)}
	}
	var c config
	switch strings.ToLower(strings.TrimSpace(string(o.Format))) {
	case "", "auto":
		c.format = FormatAuto
	case "csv", "text", "txt":
		c.format = FormatCSV
	case "f32le":
		c.format = FormatF32LE
	case "f64le":
		c.format = FormatF64LE
	case "npy", "npz", "tdms", "wav":
		c.format = Format(strings.ToLower(strings.TrimSpace(string(o.Format))))
	default:
		return c, bad("format %q (want auto, csv, f32le, f64le, npy, npz, tdms or wav)", o.Format)
	}
	switch strings.ToLower(strings.TrimSpace(string(o.NaN))) {
	case "", "reject":
		c.nan = NaNReject
	case "drop":
		c.nan = NaNDrop
	case "interpolate":
		c.nan = NaNInterpolate
	default:
		return c, bad("NaN policy %q (want reject, drop or interpolate)", o.NaN)
	}
	switch {
	case o.MinLength < 0:
		return c, bad("minimum length %d is negative", o.MinLength)
	case o.MinLength == 0:
		c.minLen = DefaultMinLength
	default:
		c.minLen = o.MinLength
	}
	switch {
	case o.MaxSamples < 0:
		return c, bad("maximum samples %d is negative", o.MaxSamples)
	case o.MaxSamples == 0:
		c.maxN = DefaultMaxSamples
	default:
		c.maxN = o.MaxSamples
	}
	col := strings.TrimSpace(o.Column)
	if col != "" && isDigits(col) {
		i, err := strconv.Atoi(col)
		if err != nil || i < 1 {
			return c, &Error{File: name, Err: ErrNoColumn,
				Detail: fmt.Sprintf("column %s: columns are numbered from 1", col)}
		}
		c.colIndex = i
	} else {
		c.colName = col
	}
	return c, nil
}

func isDigits(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return false
		}
	}
	return len(s) > 0
}
