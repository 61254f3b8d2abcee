package trace

import (
	"archive/zip"
	"bytes"
	"encoding/binary"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// wavFile renders a canonical 44-byte-header WAV (RIFF, "fmt " of 16
// bytes, "data") with the given fmt fields, as the RIFF WAVE description
// lays it out.
func wavFile(tag, channels uint16, rate uint32, bits, align uint16, data []byte) []byte {
	le := binary.LittleEndian
	b := []byte("RIFF")
	b = le.AppendUint32(b, uint32(36+len(data)))
	b = append(b, "WAVEfmt "...)
	b = le.AppendUint32(b, 16)
	b = le.AppendUint16(b, tag)
	b = le.AppendUint16(b, channels)
	b = le.AppendUint32(b, rate)
	b = le.AppendUint32(b, rate*uint32(align))
	b = le.AppendUint16(b, align)
	b = le.AppendUint16(b, bits)
	b = append(b, "data"...)
	b = le.AppendUint32(b, uint32(len(data)))
	return append(b, data...)
}

// npyFile renders a version 1.0 NPY file with the header dictionary dict
// (padded to 64 bytes with spaces and '\n', as NEP 1 asks) and data.
func npyFile(dict string, data []byte) []byte {
	h := dict
	for (10+len(h)+1)%64 != 0 {
		h += " "
	}
	h += "\n"
	b := append([]byte("\x93NUMPY\x01\x00"), byte(len(h)), byte(len(h)>>8))
	return append(append(b, h...), data...)
}

func golden(t *testing.T, name string) []byte {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "testdata", "formats", name))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// zipped renders an archive of the given members, stored.
func zipped(t *testing.T, members map[string][]byte, order ...string) []byte {
	t.Helper()
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, name := range order {
		w, err := zw.CreateHeader(&zip.FileHeader{Name: name, Method: zip.Store})
		if err != nil {
			t.Fatal(err)
		}
		w.Write(members[name])
	}
	if err := zw.Close(); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// TestContainerErrors checks that each kind of damaged or unreadable
// container is refused with its sentinel and a one-line message naming
// the file, the place (member, segment, byte offset) and the reason. The
// offsets follow from the layouts: an NPY 1.0 header starts at byte 10
// and NumPy pads it so that the data start at byte 128 (NEP 1); a TDMS
// lead-in is 28 bytes with the version at 8, the segment length at 12
// and the meta data length at 20; a canonical WAV has "fmt " at 12 (body
// at 20: tag 20, channels 22, rate 24, alignment 32, bits 34) and "data"
// at 36 (length at 40).
func TestContainerErrors(t *testing.T) {
	f8 := golden(t, "f8.npy")
	table := golden(t, "table.npy")
	incr := incrementalExample(t)
	seg2 := 28 + 0xA7 // the first segment's lead-in and body
	badTag := bytes.Clone(incr)
	copy(badTag[seg2:], "TDSx")
	version := bytes.Clone(incr)
	version[seg2+8] = 0x67 // 4711
	metaLong := bytes.Clone(incr)
	metaLong[seg2+20] = 0x51 // meta data 81 bytes in a segment of 80
	pcm := make([]byte, 40)
	for i := range pcm {
		pcm[i] = byte(i * 37)
	}
	tests := []struct {
		name   string
		file   string
		data   []byte
		opts   Options
		target error
		want   string
	}{
		{"truncated npy", "x.npy", f8[:200], Options{}, ErrTruncated,
			`x.npy byte 200: truncated: the <f8 array of shape (300,) needs 2400 bytes of data, the file holds 72`},
		{"npy header cut", "x.npy", f8[:50], Options{}, ErrTruncated,
			`x.npy byte 10: truncated: NPY header needs 118 bytes, the file has 40 left`},
		{"complex dtype", "x.npy", npyFile("{'descr': '<c16', 'fortran_order': False, 'shape': (3,), }", make([]byte, 48)), Options{}, ErrUnsupported,
			`x.npy byte 10: unsupported content: dtype "<c16": only integer (i1–i8, u1–u8) and floating-point (f2, f4, f8) arrays are read; save the real part or the magnitude (numpy.abs)`},
		{"long double", "x.npy", npyFile("{'descr': '<f16', 'fortran_order': False, 'shape': (3,), }", make([]byte, 48)), Options{}, ErrUnsupported,
			`x.npy byte 10: unsupported content: dtype "<f16": 16-byte floating-point values are not read (f2, f4, f8, i1–i8, u1–u8 are)`},
		{"string dtype", "x.npy", npyFile("{'descr': '<U5', 'fortran_order': False, 'shape': (3,), }", make([]byte, 60)), Options{}, ErrUnsupported,
			`x.npy byte 10: unsupported content: dtype "<U5": only integer (i1–i8, u1–u8) and floating-point (f2, f4, f8) arrays are read; objects and strings are not samples`},
		{"three dimensions", "x.npy", npyFile("{'descr': '<f8', 'fortran_order': False, 'shape': (2, 2, 2), }", make([]byte, 64)), Options{}, ErrUnsupported,
			`x.npy byte 10: unsupported content: a 3-dimensional array; save one series (1-D) or a table (2-D, one column per channel)`},
		{"scalar", "x.npy", npyFile("{'descr': '<f8', 'fortran_order': False, 'shape': (), }", make([]byte, 8)), Options{}, ErrUnsupported,
			`x.npy byte 10: unsupported content: a 0-dimensional array holds a single value, not a series`},
		{"bytes after data", "x.npy", append(bytes.Clone(f8), 0, 0, 0), Options{}, ErrMalformed,
			`x.npy byte 2528: malformed file: 3 bytes after the data of the <f8 array of shape (300,)`},
		{"not numpy's dict", "x.npy", npyFile("{'shape': (3,), 'descr': '<f8', 'fortran_order': False}", make([]byte, 24)), Options{}, ErrMalformed,
			`x.npy byte 10: malformed file: NPY header "{'shape': (3,), 'descr': '<f8', 'fortran_order': False}" is not the dictionary NumPy writes ({'descr': ..., 'fortran_order': ..., 'shape': (...), } then '\n')`},
		{"version 3", "x.npy", append([]byte("\x93NUMPY\x03\x00"), f8[8:]...), Options{}, ErrUnsupported,
			`x.npy byte 6: unsupported content: NPY format version 3.0 (UTF-8 field names); save with numpy.save as version 1.0 or 2.0`},
		{"npy name, other bytes", "x.npy", []byte("1\n2\n3\n"), Options{}, ErrMalformed,
			`x.npy byte 0: malformed file: the name ends in .npy but the file does not start with the NPY magic bytes (it starts with "1\n2\n3\n"); use --input-format to read it as something else`},
		{"npy column by name", "x.npy", table, Options{Column: "Id"}, ErrNoColumn,
			`x.npy: no such column: "Id": the columns of a NumPy array are chosen by number, 1 to 3`},
		{"npy column past the table", "x.npy", table, Options{Column: "4"}, ErrNoColumn,
			`x.npy: no such column: column 4: the file has 3 ("1", "2", "3")`},
		{"npz member missing", "x.npz", golden(t, "run.npz"), Options{Column: "voltage"}, ErrNoColumn,
			`x.npz: no such column: array "voltage": the file has "time", "current", "table"`},
		{"npz cut off", "x.npz", golden(t, "run.npz")[:3000], Options{}, ErrMalformed,
			`x.npz: malformed file: NPZ (zip) archive: zip: not a valid zip file`},
		{"npz member truncated", "x.npz", zipped(t, map[string][]byte{"x.npy": f8[:600]}, "x.npy"), Options{}, ErrTruncated,
			`x.npz member "x" byte 600: truncated: the <f8 array of shape (300,) needs 2400 bytes of data, the file holds 472`},
		{"npz column of a 1-D member", "x.npz", zipped(t, map[string][]byte{"x.npy": f8}, "x.npy"), Options{Column: "x/2"}, ErrNoColumn,
			`x.npz member "x": no such column: column 2: the file has 1 ("1")`},
		{"tdms bad lead-in tag", "x.tdms", badTag, Options{}, ErrMalformed,
			`x.tdms segment 2, byte 195: malformed file: lead-in tag "TDSx", want "TDSm"`},
		{"tdms lead-in cut", "x.tdms", incr[:len(incr)-97-18], Options{}, ErrTruncated,
			`x.tdms segment 5, byte 644: truncated: lead-in cut off: 10 of 28 bytes`},
		{"tdms version", "x.tdms", version, Options{}, ErrUnsupported,
			`x.tdms segment 2, byte 203: unsupported content: TDMS version 4711 (4712 and 4713 are read)`},
		{"tdms meta data longer than segment", "x.tdms", metaLong, Options{}, ErrMalformed,
			`x.tdms segment 2, byte 215: malformed file: meta data length 81, more than the segment's 80 bytes`},
		{"tdms index file", "x.tdms_index", append([]byte("TDSh"), incr[4:28]...), Options{}, ErrUnsupported,
			`x.tdms_index segment 1, byte 0: unsupported content: tag "TDSh": this is a *.tdms_index file; give the *.tdms file it indexes`},
		{"tdms channel missing", "x.tdms", incr, Options{Column: "group/current"}, ErrNoColumn,
			`x.tdms: no such column: channel "group/current": the file has "group/channel1", "group/channel2", "group/voltage"`},
		{"wav form type", "x.wav", append([]byte("RIFF\x04\x00\x00\x00WAVX"), make([]byte, 8)...), Options{Format: FormatWAV}, ErrMalformed,
			`x.wav byte 8: malformed file: RIFF form type "WAVX", want "WAVE"`},
		{"wav block alignment", "x.wav", wavFile(1, 2, 8000, 16, 2, pcm), Options{}, ErrMalformed,
			`x.wav byte 32: malformed file: block alignment 2, want 2 channels × 2 bytes = 4`},
		{"wav 12-bit", "x.wav", wavFile(1, 1, 8000, 12, 2, pcm), Options{}, ErrUnsupported,
			`x.wav byte 34: unsupported content: 12-bit PCM (8, 16, 24 and 32 are read)`},
		{"wav compressed", "x.wav", wavFile(2, 1, 8000, 4, 1, pcm), Options{}, ErrUnsupported,
			`x.wav byte 20: unsupported content: WAV format tag 0x0002: only PCM integer (1) and IEEE float (3) samples are read, not compressed audio`},
		{"wav data cut off", "x.wav", wavFile(1, 1, 8000, 16, 2, pcm)[:60], Options{}, ErrTruncated,
			`x.wav byte 40: truncated: "data" chunk of 40 bytes, the file has 16 left`},
		{"wav no fmt", "x.wav", []byte("RIFF\x04\x00\x00\x00WAVEdata\x02\x00\x00\x00\x01\x02"), Options{}, ErrMalformed,
			`x.wav byte 12: malformed file: "data" chunk before the "fmt " chunk`},
		{"wav channel 3 of 2", "x.wav", wavFile(1, 2, 8000, 16, 4, pcm), Options{Column: "3"}, ErrNoColumn,
			`x.wav: no such column: channel 3: the file has 2 ("1", "2")`},
		{"wav big-endian", "x.wav", append([]byte("RIFX\x00\x00\x00\x04WAVE"), make([]byte, 8)...), Options{}, ErrUnsupported,
			`x.wav byte 0: unsupported content: big-endian RIFX WAV; convert it to little-endian RIFF`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			tc.opts.Name = tc.file
			tc.opts.MinLength = 1
			_, err := Read(bytes.NewReader(tc.data), tc.opts)
			if err == nil {
				t.Fatal("no error")
			}
			if !errors.Is(err, tc.target) {
				t.Errorf("error %v is not %v", err, tc.target)
			}
			if err.Error() != tc.want {
				t.Errorf("message\n got %s\nwant %s", err, tc.want)
			}
			if strings.ContainsAny(err.Error(), "\n\r") {
				t.Errorf("multi-line message")
			}
		})
	}
}
