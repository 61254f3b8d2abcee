package trace

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
)

// The container readers' fuzz targets: whatever the bytes, Read returns a
// valid trace or a one-line *Error, never a panic (checkRead). Their seeds
// are the reference files of testdata/formats and the TDMS examples of
// NI's format description; `go test` runs the seeds only.

// containerOptions cycles the options a fuzz input is read with: the
// channel choice and the NaN policy.
func containerOptions(format Format, mode uint8) Options {
	columns := [...]string{"", "1", "2", "group/channel2", "current", "table/3", "x"}
	policies := [...]NaNPolicy{NaNReject, NaNDrop, NaNInterpolate}
	return Options{Format: format, Column: columns[int(mode)%len(columns)], NaN: policies[int(mode/8)%3],
		MinLength: 2, MaxSamples: 1 << 20, Name: "fuzz"}
}

func addFormatSeeds(f *testing.F, pattern string) {
	files, _ := filepath.Glob(filepath.Join("..", "testdata", "formats", pattern))
	if len(files) == 0 {
		f.Fatalf("no seeds %s", pattern)
	}
	for _, p := range files {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		for _, mode := range []uint8{0, 2, 5, 9} {
			f.Add(b, mode)
		}
	}
}

func fuzzContainer(f *testing.F, format Format) {
	f.Fuzz(func(t *testing.T, data []byte, mode uint8) {
		opts := containerOptions(format, mode)
		if mode&0x80 != 0 {
			opts.Format = FormatAuto // detection by magic bytes
		}
		tr, err := Read(bytes.NewReader(data), opts)
		checkRead(t, tr, err, opts)
	})
}

func FuzzNPY(f *testing.F) {
	addFormatSeeds(f, "*.npy")
	fuzzContainer(f, FormatNPY)
}

func FuzzNPZ(f *testing.F) {
	addFormatSeeds(f, "*.npz")
	fuzzContainer(f, FormatNPZ)
}

func FuzzWAV(f *testing.F) {
	addFormatSeeds(f, "*.wav")
	fuzzContainer(f, FormatWAV)
}

func FuzzTDMS(f *testing.F) {
	for _, mode := range []uint8{0, 2, 3, 0x80} {
		f.Add(incrementalExample(f), mode)
	}
	f.Add(hx(f, "54 44 53 6D 0E 00 00 00 69 12 00 00 E6 00 00 00 00 00 00 00 DE 00 00 00 00 00 00 00"), uint8(0))
	fuzzContainer(f, FormatTDMS)
}
