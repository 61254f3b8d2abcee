package trace

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"
	"testing"
)

// benchCSV renders n rows "t,value" with a header, the shape of a typical
// export (time in %.6e, value with 8 significant digits).
func benchCSV(n int, delim string, decComma bool) []byte {
	var b bytes.Buffer
	b.Grow(n * 32)
	b.WriteString("time (s)" + delim + "Id (A)\n")
	var line []byte
	for i := range n {
		line = line[:0]
		line = strconv.AppendFloat(line, float64(i)*1e-6, 'e', 6, 64)
		line = append(line, delim...)
		line = strconv.AppendFloat(line, 1e-6*(1+0.1*val(i)), 'g', 8, 64)
		if decComma {
			line = bytes.ReplaceAll(line, []byte("."), []byte(","))
		}
		b.Write(line)
		b.WriteByte('\n')
	}
	return b.Bytes()
}

func benchRead(b *testing.B, in []byte, opts Options, n int) {
	b.SetBytes(int64(len(in)))
	b.ReportAllocs()
	for b.Loop() {
		tr, err := Read(bytes.NewReader(in), opts)
		if err != nil || len(tr.Values) != n {
			b.Fatalf("%v (%d values)", err, len(tr.Values))
		}
	}
}

// BenchmarkReadCSV reads 10^6 rows of a two-column CSV with a time column.
func BenchmarkReadCSV(b *testing.B) {
	const n = 1_000_000
	benchRead(b, benchCSV(n, ",", false), Options{}, n)
}

// BenchmarkReadSemicolonDecimalComma is the same table exported with ';'
// and decimal commas.
func BenchmarkReadSemicolonDecimalComma(b *testing.B) {
	const n = 1_000_000
	benchRead(b, benchCSV(n, ";", true), Options{}, n)
}

// BenchmarkReadGzipCSV adds gzip decompression.
func BenchmarkReadGzipCSV(b *testing.B) {
	const n = 1_000_000
	benchRead(b, gz(b, string(benchCSV(n, ",", false))), Options{}, n)
}

// BenchmarkReadSingleColumn reads 10^6 bare values, one per line.
func BenchmarkReadSingleColumn(b *testing.B) {
	const n = 1_000_000
	var s strings.Builder
	for i := range n {
		fmt.Fprintf(&s, "%g\n", val(i))
	}
	benchRead(b, []byte(s.String()), Options{}, n)
}

// BenchmarkReadF64LE reads 10^6 raw float64 samples.
func BenchmarkReadF64LE(b *testing.B) {
	const n = 1_000_000
	benchRead(b, rawF64(vals(n)), Options{Format: FormatF64LE}, n)
}
