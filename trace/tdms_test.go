package trace

import (
	"bytes"
	"encoding/binary"
	"encoding/hex"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"
)

// The TDMS reader is checked against the examples of NI's format
// description, "TDMS File Format Internal Structure" (National
// Instruments, updated 2024), rebuilt here byte for byte from its
// tables: the lead-in, the meta data of a group and a channel, the
// interleaved and non-interleaved raw data layouts, the five segments of
// the incremental meta information example and the DAQmx raw data index.

// hx decodes the hexadecimal bytes of a table of the description
// (spaces and line breaks ignored).
func hx(t testing.TB, s string) []byte {
	t.Helper()
	b, err := hex.DecodeString(strings.Join(strings.Fields(s), ""))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// leadIn builds a lead-in for meta and raw data of the given lengths.
func leadIn(toc uint32, metaLen, rawLen int, bo binary.AppendByteOrder) []byte {
	b := []byte("TDSm")
	b = binary.LittleEndian.AppendUint32(b, toc)
	b = bo.AppendUint32(b, 4713)
	b = bo.AppendUint64(b, uint64(metaLen+rawLen))
	return bo.AppendUint64(b, uint64(metaLen))
}

func readTDMSBytes(b []byte, column string) (Trace, error) {
	return Read(bytes.NewReader(b), Options{Name: "x.tdms", Column: column, MinLength: 1})
}

func wantValues(t *testing.T, tr Trace, err error, want []float64) {
	t.Helper()
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(tr.Values, want) {
		t.Fatalf("values %v, want %v", tr.Values, want)
	}
}

// The description's lead-in example: ToC 0x0E, version 4713, next
// segment offset 230, raw data offset 222. Alone it announces 230 bytes
// that are not there, which the reader must say at the offset field.
func TestTDMSLeadInExample(t *testing.T) {
	lead := hx(t, "54 44 53 6D 0E 00 00 00 69 12 00 00 E6 00 00 00 00 00 00 00 DE 00 00 00 00 00 00 00")
	_, err := readTDMSBytes(lead, "")
	const want = "x.tdms segment 1, byte 12: truncated: the segment needs 230 bytes after its lead-in, the file has 0 left"
	if err == nil || err.Error() != want {
		t.Fatalf("got %v, want %s", err, want)
	}
}

// The description's meta data example (a group with a string and an I32
// property, a channel with an index for two I32 values and no
// properties), in a segment with two values of raw data.
func TestTDMSMetaExample(t *testing.T) {
	meta := hx(t, `02 00 00 00 08 00 00 00 2F 27 47 72 6F 75 70 27 FF FF FF FF 02 00 00 00
		04 00 00 00 70 72 6F 70 20 00 00 00 05 00 00 00 76 61 6C 75 65
		03 00 00 00 6E 75 6D 03 00 00 00 0A 00 00 00
		13 00 00 00 2F 27 47 72 6F 75 70 27 2F 27 43 68 61 6E 6E 65 6C 31 27
		14 00 00 00 03 00 00 00 01 00 00 00 02 00 00 00 00 00 00 00 00 00 00 00`)
	raw := hx(t, "FE FF FF FF 07 00 00 00") // -2, 7
	file := append(append(leadIn(0x0E, len(meta), len(raw), binary.LittleEndian), meta...), raw...)
	for _, col := range []string{"", "Group/Channel1", "Channel1", "1"} {
		tr, err := readTDMSBytes(file, col)
		wantValues(t, tr, err, []float64{-2, 7})
		if tr.Column != "Group/Channel1" || tr.Format != FormatTDMS || tr.Columns != 1 {
			t.Errorf("column %q format %q columns %d", tr.Column, tr.Format, tr.Columns)
		}
	}
}

// The description's raw data layouts: channel 1 holds 1, 2, 3 and
// channel 2 holds 4, 5, 6 as I32, non-interleaved and interleaved.
func TestTDMSLayoutExample(t *testing.T) {
	meta := hx(t, `02 00 00 00
		13 00 00 00 2F 27 67 72 6F 75 70 27 2F 27 63 68 61 6E 6E 65 6C 31 27
		14 00 00 00 03 00 00 00 01 00 00 00 03 00 00 00 00 00 00 00 00 00 00 00
		13 00 00 00 2F 27 67 72 6F 75 70 27 2F 27 63 68 61 6E 6E 65 6C 32 27
		14 00 00 00 03 00 00 00 01 00 00 00 03 00 00 00 00 00 00 00 00 00 00 00`)
	layouts := map[uint32]string{
		0x0E:        "01 00 00 00  02 00 00 00  03 00 00 00  04 00 00 00  05 00 00 00  06 00 00 00",
		0x0E | 0x20: "01 00 00 00  04 00 00 00  02 00 00 00 05 00 00 00  03 00 00 00  06 00 00 00",
	}
	for toc, rawHex := range layouts {
		raw := hx(t, rawHex)
		file := append(append(leadIn(toc, len(meta), len(raw), binary.LittleEndian), meta...), raw...)
		tr, err := readTDMSBytes(file, "group/channel1")
		wantValues(t, tr, err, []float64{1, 2, 3})
		tr, err = readTDMSBytes(file, "channel2")
		wantValues(t, tr, err, []float64{4, 5, 6})
		if tr.ColumnIndex != 2 || tr.Columns != 2 {
			t.Errorf("ToC %#x: column %d of %d", toc, tr.ColumnIndex, tr.Columns)
		}
		tr, err = readTDMSBytes(file, "")
		wantValues(t, tr, err, []float64{1, 2, 3})
		if len(tr.Warnings) != 1 || !strings.Contains(tr.Warnings[0], `read "group/channel1"`) {
			t.Errorf("warnings %q", tr.Warnings)
		}
	}
}

// incrementalExample is the description's incremental meta information
// example: the first segment after its second writing iteration (raw
// data appended, next segment offset 0xA7), then segments 2 to 5.
func incrementalExample(t testing.TB) []byte {
	segs := []string{
		`54 44 53 6D  0E 00 00 00  69 12 00 00 A7 00 00 00  00 00 00 00  77 00 00 00 00 00 00 00
		02 00 00 00
		13 00 00 00  2F 27 67 72  6F 75 70 27 2F 27 63 68  61 6E 6E 65  6C 31 27 14 00 00 00 03  00 00 00 01  00 00 00 03 00 00 00 00  00 00 00 01  00 00 00 04 00 00 00 70  72 6F 70 20  00 00 00 05 00 00 00 76  61 6C 69 64
		13 00 00 00  2F 27 67 72  6F 75 70 27 2F 27 63 68  61 6E 6E 65  6C 32 27 14 00 00 00 03  00 00 00 01  00 00 00 03 00 00 00 00  00 00 00 00  00 00 00
		01 00 00 00  02 00 00 00  03 00 00 00
		04 00 00 00  05 00 00 00  06 00 00 00
		01 00 00 00  02 00 00 00  03 00 00 00
		04 00 00 00  05 00 00 00  06 00 00 00`,
		`54 44 53 6D  0A 00 00 00  69 12 00 00 50 00 00 00  00 00 00 00  38 00 00 00 00 00 00 00
		01 00 00 00
		13 00 00 00  2F 27 67 72  6F 75 70 27 2F 27 63 68  61 6E 6E 65  6C 31 27 0000 00 00 01  00 00 00 04  00 00 00 70   72 6F 70 20  00 00 00 05  00 00 00 65   72 72 6F 72
		01 00 00 00  02 00 00 00  03 00 00 00
		04 00 00 00  05 00 00 00  06 00 00 00`,
		`54 44 53 6D  0A 00 00 00  69 12 00 00 5E 00 00 00  00 00 00 00  32 00 00 00 00 00 00 00
		01 00 00 00
		12 00 00 00  2F 27 67 72  6F 75 70 27 2F 27 76 6F  6C 74 61 67  65 27 14 00 00 00 03 00  00 00 01 00  00 00 05 00 00 00 00 00  00 00 00 00  00 00
		01 00 00 00  02 00 00 00  03 00 00 00
		04 00 00 00  05 00 00 00  06 00 00 00
		07 00 00 00  08 00 00 00  09 00 00 00 0A 00 00 00  0B 00 00 00`,
		`54 44 53 6D  0A 00 00 00  69 12 00 00 BF 00 00 00  00 00 00 00  33 00 00 00 00 00 00 00
		01 00 00 00
		13 00 00 00  2F 27 67 72  6F 75 70 27 2F 27 63 68  61 6E 6E 65  6C 32 27 14 00 00 00 03  00 00 00 01  00 00 00 1B 00 00 00 00  00 00 00 00  00 00 00
		01 00 00 00  02 00 00 00  03 00 00 00
		01 00 00 00  02 00 00 00  03 00 00 00 04 00 00 00  05 00 00 00  06 00 00 00 07 00 00 00  08 00 00 00  09 00 00 00 0A 00 00 00  0B 00 00 00  0C 00 00 00 0D 00 00 00  0E 00 00 00  0F 00 00 00 10 00 00 00  11 00 00 00  12 00 00 00 13 00 00 00  14 00 00 00  15 00 00 00 16 00 00 00  17 00 00 00  18 00 00 00 19 00 00 00  1A 00 00 00  1B 00 00 00
		07 00 00 00  08 00 00 00  09 00 00 00 0A 00 00 00  0B 00 00 00`,
		`54 44 53 6D  0E 00 00 00  69 12 00 00 61 00 00 00  00 00 00 00  41 00 00 00 00 00 00 00
		02 00 00 00
		13 00 00 00  2F 27 67 72  6F 75 70 27 2F 27 63 68  61 6E 6E 65  6C 31 27 00 00 00 00 00  00 00 00
		12 00 00 00  2F 27 67 72  6F 75 70 27 2F 27 76 6F  6C 74 61 67  65 27 00 00 00 00 00 00  00 00
		01 00 00 00  02 00 00 00  03 00 00 00
		07 00 00 00  08 00 00 00  09 00 00 00 0A 00 00 00  0B 00 00 00`,
	}
	var file []byte
	for _, s := range segs {
		file = append(file, hx(t, s)...)
	}
	return file
}

func TestTDMSIncrementalExample(t *testing.T) {
	file := incrementalExample(t)
	rep := func(v []float64, k int) []float64 {
		var out []float64
		for range k {
			out = append(out, v...)
		}
		return out
	}
	// Channel 1 is written in every segment, twice in the first.
	tr, err := readTDMSBytes(file, "group/channel1")
	wantValues(t, tr, err, rep([]float64{1, 2, 3}, 6))
	// Channel 2: three values in segments 1 (twice), 2 and 3, then 27 in
	// segment 4, and none in segment 5, whose new object list drops it.
	var ch2 []float64
	for i := 1; i <= 27; i++ {
		ch2 = append(ch2, float64(i))
	}
	tr, err = readTDMSBytes(file, "group/channel2")
	wantValues(t, tr, err, append(rep([]float64{4, 5, 6}, 4), ch2...))
	// voltage joins the object list in segment 3.
	tr, err = readTDMSBytes(file, "voltage")
	wantValues(t, tr, err, rep([]float64{7, 8, 9, 10, 11}, 3))
	if tr.ColumnIndex != 3 || tr.Columns != 3 {
		t.Errorf("voltage is channel %d of %d, want 3 of 3", tr.ColumnIndex, tr.Columns)
	}
}

// tdmsChannelMeta renders the meta data of one channel object with a
// fresh index for n values of type typ and the given properties.
func tdmsChannelMeta(bo binary.AppendByteOrder, path string, typ uint32, n uint64, props ...[]byte) []byte {
	b := bo.AppendUint32(nil, uint32(len(path)))
	b = append(b, path...)
	b = bo.AppendUint32(b, 20)
	b = bo.AppendUint32(b, typ)
	b = bo.AppendUint32(b, 1)
	b = bo.AppendUint64(b, n)
	b = bo.AppendUint32(b, uint32(len(props)))
	for _, p := range props {
		b = append(b, p...)
	}
	return b
}

func tdmsStringProp(bo binary.AppendByteOrder, name, v string) []byte {
	b := bo.AppendUint32(nil, uint32(len(name)))
	b = append(b, name...)
	b = bo.AppendUint32(b, tdsString)
	b = bo.AppendUint32(b, uint32(len(v)))
	return append(b, v...)
}

func tdmsDoubleProp(bo binary.AppendByteOrder, name string, v float64) []byte {
	b := bo.AppendUint32(nil, uint32(len(name)))
	b = append(b, name...)
	b = bo.AppendUint32(b, tdsDouble)
	return bo.AppendUint64(b, math.Float64bits(v))
}

// A big-endian segment (kTocBigEndian: every number after the ToC,
// lead-in included, big-endian) with a DBL channel carrying wf_increment
// and unit_string, beside an I16 channel, in two segments.
func TestTDMSBigEndianProperties(t *testing.T) {
	bo := binary.BigEndian
	var file []byte
	for seg := range 2 {
		meta := bo.AppendUint32(nil, 2)
		meta = append(meta, tdmsChannelMeta(bo, "/'Dev 1'/'Id'", tdsDouble, 3,
			tdmsDoubleProp(bo, "wf_increment", 2.5e-6), tdmsStringProp(bo, "unit_string", "A"))...)
		meta = append(meta, tdmsChannelMeta(bo, "/'Dev 1'/'Vg'", tdsI16, 3)...)
		var raw []byte
		for i := range 3 {
			raw = bo.AppendUint64(raw, math.Float64bits(float64(seg*3+i)*0.25))
		}
		for i := range 3 {
			raw = bo.AppendUint16(raw, uint16(int16(-i)))
		}
		file = append(file, leadIn(0x0E|0x40, len(meta), len(raw), bo)...)
		file = append(append(file, meta...), raw...)
	}
	tr, err := readTDMSBytes(file, "Dev 1/Id")
	wantValues(t, tr, err, []float64{0, 0.25, 0.5, 0.75, 1, 1.25})
	if tr.Interval != 2.5e-6 || tr.TimeUnit != "s" || tr.Unit != "A" {
		t.Errorf("interval %v %s, unit %q", tr.Interval, tr.TimeUnit, tr.Unit)
	}
	tr, err = readTDMSBytes(file, "2")
	wantValues(t, tr, err, []float64{0, -1, -2, 0, -1, -2})
}

// The description's DAQmx raw data index example: the channel cannot be
// read (its layout is DAQmx's), and the reader says so.
func TestTDMSDAQmxExample(t *testing.T) {
	meta := hx(t, `03 00 00 00
		23 00 00 00 2F 27 4D 65 61 73 75 72 65 64 20 54 68 72 6F 75 67 68 70 75 74 20 44 61 74 61 20 28 56 6F 6C 74 73 29 27
		FF FF FF FF 00 00 00 00
		34 00 00 00 2F 27 4D 65 61 73 75 72 65 64 20 54 68 72 6F 75 67 68 70 75 74 20 44 61 74 61 20 28 56 6F 6C 74 73 29 27 2F 27 50 58 49 31 53 6C 6F 74 30 33 2d 61 69 30 27
		69 12 00 00 FF FF FF FF 01 00 00 00 00 00 00 00 00 00 00 00
		01 00 00 00 05 00 00 00 00 00 00 00 00 00 00 00 00 00 00 00 00 00 00 00
		01 00 00 00 08 00 00 00
		00 00 00 00
		01 00 00 00 2F FF FF FF FF 00 00 00 00`)
	// The table's path bytes end in "27 69 12 00 00", repeating the index
	// marker of the next row; the path length 0x34 = 52 holds the path
	// alone, as rebuilt above. The description's object count 3 includes
	// the file object "/", added last here.
	raw := make([]byte, 16)
	file := append(append(leadIn(0x8E, len(meta), len(raw), binary.LittleEndian), meta...), raw...)
	_, err := readTDMSBytes(file, "")
	const want = `x.tdms: unsupported content: channel "Measured Throughput Data (Volts)/PXI1Slot03-ai0" holds DAQmx raw data, not numbers`
	if !errors.Is(err, ErrUnsupported) || err.Error() != want {
		t.Fatalf("got %v, want %s", err, want)
	}
}

// Properties may come before the data: a first segment names the channel
// with no raw data (index 0xFFFFFFFF) but its wf_increment and
// unit_string, a second gives its index and values; the description's
// rule that later segments add to earlier meta data keeps both.
func TestTDMSPropertiesBeforeData(t *testing.T) {
	le := binary.LittleEndian
	path := "/'Dev'/'Id'"
	meta1 := le.AppendUint32(nil, 1)
	meta1 = le.AppendUint32(meta1, uint32(len(path)))
	meta1 = append(meta1, path...)
	meta1 = le.AppendUint32(meta1, tdmsNoData)
	meta1 = le.AppendUint32(meta1, 2)
	meta1 = append(meta1, tdmsDoubleProp(le, "wf_increment", 0.5)...)
	meta1 = append(meta1, tdmsStringProp(le, "unit_string", "nA")...)
	file := append(leadIn(0x06, len(meta1), 0, le), meta1...)
	meta2 := append(le.AppendUint32(nil, 1), tdmsChannelMeta(le, path, tdsI8, 3)...)
	raw := []byte{0xFF, 2, 0x80}
	file = append(append(append(file, leadIn(0x0A, len(meta2), len(raw), le)...), meta2...), raw...)
	tr, err := readTDMSBytes(file, "")
	wantValues(t, tr, err, []float64{-1, 2, -128})
	if tr.Interval != 0.5 || tr.Unit != "nA" {
		t.Errorf("interval %v, unit %q", tr.Interval, tr.Unit)
	}
}
