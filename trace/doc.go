// Package trace reads and validates measured fluctuation traces: one
// series of float64 samples, with the sample interval when the input has a
// time column.
//
// # Inputs
//
// Read takes any io.Reader; ReadFile takes a path ("-" is standard input).
// Gzip is recognised by its magic bytes 1f 8b 08 for every format. Text
// may be UTF-8 (with or without byte-order mark, LF, CRLF or lone-CR line
// ends) or UTF-16 with a byte-order mark. Raw binary (FormatF32LE,
// FormatF64LE: headerless little-endian IEEE-754 samples, one channel) is
// only read when asked for: text input whose first 4 KiB hold a NUL byte
// or more than 30% control bytes and invalid UTF-8 (raw samples, other
// binary files, UTF-16 without byte-order mark) fails with ErrBinary, as
// does a NUL byte in a line before the table.
//
// # Binary containers
//
// NumPy .npy and .npz (decoded by codeberg.org/sbinet/npyio after this
// package checks the header), NI TDMS (read from NI's "TDMS File Format
// Internal Structure") and WAV (PCM 8/16/24/32-bit, IEEE float 32/64-bit)
// are recognised by their magic bytes under FormatAuto, or named by
// FormatNPY, FormatNPZ, FormatTDMS and FormatWAV. Options.Column chooses
// the column, member or channel (see Options.Column). A TDMS channel's
// wf_increment becomes Trace.Interval (seconds) and its unit_string
// Trace.Unit; a WAV file's sample rate gives Interval = 1/rate. A file
// arriving on a pipe or gzip-compressed is held in memory (at most
// 16·MaxSamples bytes plus 1 MiB); a file given by path is read in place.
// Errors are located by NPZ member, TDMS segment and byte offset
// (ErrMalformed, ErrUnsupported, ErrTruncated).
//
// # Text layout detection
//
// Nothing needs to be said about a text file; the reader works it out:
//
//   - Blank lines are ignored anywhere. Lines whose first non-blank
//     characters are "#", "%" or "//" are comments anywhere; so are lines
//     starting with ";" unless the table itself is ';'-delimited.
//   - A line is a numeric row when, split by its delimiter, every field is
//     a number (strconv syntax, including NaN and Inf) or missing (empty,
//     NA, N/A, null) and at least one field is a number. The delimiter of
//     a line is the first of ';', tab, ',' that occurs in it and makes it
//     numeric, else runs of spaces and tabs. Spaces around fields are
//     trimmed and fields may be double-quoted ("1.5", "Id, drain").
//   - Decimal commas ("0,001;1,25E-6") are read with every delimiter
//     except ',': a field with one ',' and no '.' uses it as the point.
//     (A one-column file with decimal commas cannot be told from two
//     comma-separated columns and is read as the latter.) Thousands
//     separators and dates or clock times as numbers are not supported.
//   - The table starts at the first run of 5 consecutive numeric rows of
//     the same shape (delimiter and field count), or at the longest such
//     run when none is that long. Lines above the table are preamble
//     ("Instrument: X", "Date,2026-01-01", "Samples,1000") and are
//     skipped, even when they contain delimiters — except that a numeric
//     row of the table's shape further up, reached without crossing a
//     non-numeric line of another field count, moves the start up to it,
//     so a bad value or ragged row among the first data rows is reported
//     rather than silently skipped. Numeric preamble lines that are
//     skipped produce a warning.
//   - The header is the line right above the table (blank and comment
//     lines between are allowed) if it has the table's field count and
//     none of its fields is a number. Header fields give the column name
//     and unit: "Id (A)", "Id [A]" and "Id/A" all mean name "Id", unit "A";
//     "Id_A" is just a name.
//   - A delimiter at the end of every row ("1;2;") is a line terminator,
//     not an empty column, unless the header names that last column.
//   - After the table starts, every non-comment line must have the
//     table's field count (else ErrRagged, whose message names the other
//     delimiter when the line is a numeric row of the table's width under
//     another of ',', ';', tab and spaces) and numbers in the columns
//     used (else ErrNotNumeric). Other columns are counted, not parsed.
//     Text lines at the very end whose first field starts with a letter
//     ("END", "Total: 1000") are a footer: ignored, with a warning.
//
// # Time column and value column
//
// With two or more columns, column 1 is the time axis when its values are
// strictly increasing over the whole table (whatever its header says), or
// when its header names time: first word t, time, timestamp, elapsed, s,
// sec, seconds, ms, us, µs, ns, ps (or Zeit, temps, tiempo, tempo), any
// word "time", or a time unit (s, ms, us, µs, ns, ps, min, h) as in
// "Zeit [s]". With the steps d_i between stamps and their median m,
// sampling is uneven when some |d_i − m| > UnevenTolerance·m + min(ρ_i,
// m/2), where ρ_i is the rounding of the two printed stamps (one unit in
// their last printed digit, averaged), so that "1.000333e+03"-style
// rounding is not taken for jitter while a missing sample always counts.
// The interval is (t_last − t_0)/(n − 1) when sampling is even, and m
// (with Trace.Uneven set and a warning) when it is uneven; both are in
// the units of the time column. A column named as time but not strictly
// increasing gives a warning and Interval 0. A first column whose header
// names a sample counter (index, sample, n, no, point, step, "#", ...) is
// skipped and gives no interval.
//
// The value column is Options.Column when set (a 1-based index or a header
// name); otherwise the only column other than time or counter, or the
// first of several (with a warning naming it).
//
// # Validation
//
// Values must be finite: NaN, ±Inf, numbers beyond float64 range and
// missing fields are rejected (ErrNonFinite, naming the first line) unless
// Options.NaN says to drop or interpolate them. A constant series fails
// with ErrConstant, and fewer than Options.MinLength samples with
// ErrTooShort. Every error is an *Error with a one-line message naming the
// source, the line (or raw sample) and the column where they apply, and
// an Err sentinel for errors.Is. Content of the file echoed in a message
// is quoted and cut to about 60 characters. The numbers behind ErrTooShort
// and ErrTooLarge are in Error.Count and Error.Limit, for callers that add
// their own advice.
package trace
