package trace

import (
	"bytes"
	"encoding/binary"
	"fmt"
	"math"
	"strconv"
	"strings"
	"testing"

	"codeberg.org/sbinet/npyio/npy"
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

// BenchmarkReadNPY reads 10^6 float64 samples from a .npy file (through
// npyio, the file written by its writer).
func BenchmarkReadNPY(b *testing.B) {
	const n = 1_000_000
	var buf bytes.Buffer
	if err := npy.Write(&buf, vals(n)); err != nil {
		b.Fatal(err)
	}
	benchRead(b, buf.Bytes(), Options{}, n)
}

// BenchmarkReadTDMS reads 10^6 DBL samples of one channel out of two, in
// 100 segments of 10^4 values per channel.
func BenchmarkReadTDMS(b *testing.B) {
	const n, per = 1_000_000, 10_000
	le := binary.LittleEndian
	x := vals(n)
	var file []byte
	for s := 0; s < n/per; s++ {
		meta := le.AppendUint32(nil, 2)
		meta = append(meta, tdmsChannelMeta(le, "/'g'/'Id'", tdsDouble, per)...)
		meta = append(meta, tdmsChannelMeta(le, "/'g'/'Vg'", tdsSingle, per)...)
		var raw []byte
		for _, v := range x[s*per : (s+1)*per] {
			raw = le.AppendUint64(raw, math.Float64bits(v))
		}
		raw = append(raw, make([]byte, 4*per)...)
		file = append(file, leadIn(0x0E, len(meta), len(raw), le)...)
		file = append(append(file, meta...), raw...)
	}
	benchRead(b, file, Options{Column: "g/Id"}, n)
}

// BenchmarkReadWAV reads 10^6 frames of a stereo 24-bit PCM file, one
// channel.
func BenchmarkReadWAV(b *testing.B) {
	const n = 1_000_000
	data := make([]byte, 6*n)
	for i := range n {
		v := int32(val(i) * 5e5) // within ±2^23
		data[6*i], data[6*i+1], data[6*i+2] = byte(v), byte(v>>8), byte(v>>16)
	}
	benchRead(b, wavFile(1, 2, 48000, 24, 6, data), Options{Column: "1"}, n)
}
