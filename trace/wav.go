package trace

import (
	"bytes"
	"encoding/binary"
	"fmt"
	"math"
)

// WAV input: a RIFF file of form type "WAVE" (Microsoft/IBM, "Multimedia
// Programming Interface and Data Specifications 1.0", 1991): the header
// "RIFF", a little-endian uint32 size and "WAVE", then chunks of a
// four-byte id, a uint32 length and the body, padded to an even length.
// The "fmt " chunk holds the format tag (1 PCM integer, 3 IEEE float,
// 0xFFFE WAVE_FORMAT_EXTENSIBLE whose sub-format GUID carries 1 or 3 in
// its first two bytes), the channel count, the sample rate, the byte rate,
// the block alignment (bytes per frame) and the bits per sample; "data"
// holds the frames, channels interleaved. 8-bit PCM is unsigned with its
// zero at 128; wider PCM is signed two's complement.

// WAV format tags.
const (
	wavPCM        = 1
	wavFloat      = 3
	wavExtensible = 0xFFFE
)

// wavGUIDTail is bytes 2–15 of the KSDATAFORMAT_SUBTYPE GUIDs of PCM and
// IEEE float in WAVE_FORMAT_EXTENSIBLE ({0000000X-0000-0010-8000-00AA00389B71}
// as stored little-endian; Microsoft, "WAVEFORMATEXTENSIBLE").
var wavGUIDTail = []byte{0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xAA, 0x00, 0x38, 0x9B, 0x71}

// wavFormat is a checked fmt chunk.
type wavFormat struct {
	tag      int // wavPCM or wavFloat after resolving the extensible form
	channels int
	rate     uint32
	bits     int
	align    int
}

// readWAV reads one channel of a WAV file: the samples as the numbers
// stored (integers for PCM, unscaled; 8-bit PCM with 128 subtracted),
// the sampling interval 1/rate in seconds.
func readWAV(c container, cfg config) (Trace, error) {
	head, err := c.at(0, 12, "RIFF header")
	if err != nil {
		return Trace{}, err
	}
	switch string(head[:4]) {
	case "RIFF":
	case "RIFX":
		return Trace{}, c.fail(0, ErrUnsupported, "big-endian RIFX WAV; convert it to little-endian RIFF")
	case "RF64":
		return Trace{}, c.fail(0, ErrUnsupported, "RF64 (64-bit) WAV; split it or save it as NPY")
	default:
		return Trace{}, c.fail(0, ErrMalformed, fmt.Sprintf("WAV header starts with %s, want \"RIFF\"", quoteField(head[:4])))
	}
	if string(head[8:12]) != "WAVE" {
		return Trace{}, c.fail(8, ErrMalformed, fmt.Sprintf("RIFF form type %s, want \"WAVE\"", quoteField(head[8:12])))
	}
	var f *wavFormat
	off := int64(12)
	var warnings []string
	for {
		if off+8 > c.size {
			if f == nil {
				return Trace{}, c.fail(off, ErrMalformed, "the file ends before a \"fmt \" chunk")
			}
			return Trace{}, c.fail(off, ErrMalformed, "the file ends before a \"data\" chunk")
		}
		ch, err := c.at(off, 8, "chunk header")
		if err != nil {
			return Trace{}, err
		}
		id, n := string(ch[:4]), int64(binary.LittleEndian.Uint32(ch[4:]))
		body := off + 8
		switch id {
		case "fmt ":
			if f != nil {
				return Trace{}, c.fail(off, ErrMalformed, "a second \"fmt \" chunk")
			}
			if n > 1<<16 {
				return Trace{}, c.fail(off+4, ErrMalformed, fmt.Sprintf("\"fmt \" chunk of %d bytes", n))
			}
			b, err := c.at(body, n, "\"fmt \" chunk")
			if err != nil {
				return Trace{}, err
			}
			if f, err = parseWAVFormat(c, body, b); err != nil {
				return Trace{}, err
			}
		case "data":
			if f == nil {
				return Trace{}, c.fail(off, ErrMalformed, "\"data\" chunk before the \"fmt \" chunk")
			}
			if n == math.MaxUint32 || n > c.size-body {
				if n != math.MaxUint32 {
					return Trace{}, c.fail(off+4, ErrTruncated, fmt.Sprintf("\"data\" chunk of %d bytes, the file has %d left", n, c.size-body))
				}
				n = c.size - body // size left open by a recorder that was not closed
				warnings = append(warnings, "the \"data\" chunk's length is unset (0xFFFFFFFF); read to the end of the file")
			}
			return wavSamples(c, f, body, n, cfg, warnings)
		}
		off = body + n + n%2
		if off > c.size {
			return Trace{}, c.fail(body-4, ErrTruncated, fmt.Sprintf("chunk %s of %d bytes runs past the end of the file", quoteField([]byte(id)), n))
		}
	}
}

// parseWAVFormat checks the fmt chunk body b found at offset at.
func parseWAVFormat(c container, at int64, b []byte) (*wavFormat, error) {
	if len(b) < 16 {
		return nil, c.fail(at, ErrMalformed, fmt.Sprintf("\"fmt \" chunk of %d bytes, at least 16 needed", len(b)))
	}
	le := binary.LittleEndian
	f := &wavFormat{tag: int(le.Uint16(b[0:])), channels: int(le.Uint16(b[2:])), rate: le.Uint32(b[4:]),
		align: int(le.Uint16(b[12:])), bits: int(le.Uint16(b[14:]))}
	if f.tag == wavExtensible {
		if len(b) < 40 || le.Uint16(b[16:]) < 22 {
			return nil, c.fail(at+16, ErrMalformed, "WAVE_FORMAT_EXTENSIBLE without its 22-byte extension")
		}
		if !bytes.Equal(b[26:40], wavGUIDTail) {
			return nil, c.fail(at+24, ErrUnsupported, "WAVE_FORMAT_EXTENSIBLE sub-format is not a standard PCM or float GUID")
		}
		f.tag = int(le.Uint16(b[24:]))
	}
	switch {
	case f.tag != wavPCM && f.tag != wavFloat:
		return nil, c.fail(at, ErrUnsupported, fmt.Sprintf("WAV format tag 0x%04X: only PCM integer (1) and IEEE float (3) samples are read, not compressed audio", f.tag))
	case f.channels == 0:
		return nil, c.fail(at+2, ErrMalformed, "0 channels")
	case f.rate == 0:
		return nil, c.fail(at+4, ErrMalformed, "sample rate 0")
	case f.tag == wavPCM && f.bits != 8 && f.bits != 16 && f.bits != 24 && f.bits != 32:
		return nil, c.fail(at+14, ErrUnsupported, fmt.Sprintf("%d-bit PCM (8, 16, 24 and 32 are read)", f.bits))
	case f.tag == wavFloat && f.bits != 32 && f.bits != 64:
		return nil, c.fail(at+14, ErrUnsupported, fmt.Sprintf("%d-bit float (32 and 64 are read)", f.bits))
	case f.align != f.channels*f.bits/8:
		return nil, c.fail(at+12, ErrMalformed, fmt.Sprintf("block alignment %d, want %d channels × %d bytes = %d", f.align, f.channels, f.bits/8, f.channels*f.bits/8))
	}
	return f, nil
}

// wavSamples decodes the chosen channel of the n data bytes at off.
func wavSamples(c container, f *wavFormat, off, n int64, cfg config, warnings []string) (Trace, error) {
	ch, err := pickNumbered(f.channels, cfg, c.name, "channel", "WAV channels", "--column N")
	if err != nil {
		return Trace{}, err
	}
	frames := n / int64(f.align)
	if rest := n % int64(f.align); rest != 0 {
		warnings = append(warnings, fmt.Sprintf("%d byte(s) of an incomplete frame at the end of the data ignored", rest))
	}
	if frames > int64(cfg.maxN) {
		return Trace{}, tooMany(c.name, uint64(frames), cfg)
	}
	data, err := c.at(off, frames*int64(f.align), "\"data\" chunk")
	if err != nil {
		return Trace{}, err
	}
	width := f.bits / 8
	vals := make([]float64, frames)
	le := binary.LittleEndian
	for i := range vals {
		b := data[i*f.align+ch.index*width:]
		switch {
		case f.tag == wavFloat && width == 4:
			vals[i] = float64(math.Float32frombits(le.Uint32(b)))
		case f.tag == wavFloat:
			vals[i] = math.Float64frombits(le.Uint64(b))
		case width == 1:
			vals[i] = float64(int(b[0]) - 128)
		case width == 2:
			vals[i] = float64(int16(le.Uint16(b)))
		case width == 3:
			vals[i] = float64(int32(uint32(b[0])<<8|uint32(b[1])<<16|uint32(b[2])<<24) >> 8)
		default:
			vals[i] = float64(int32(le.Uint32(b)))
		}
	}
	if ch.warning != "" {
		warnings = append(warnings, ch.warning)
	}
	return Trace{Values: vals, Interval: 1 / float64(f.rate), TimeUnit: "s",
		ColumnIndex: ch.index + 1, Columns: f.channels, Warnings: warnings}, nil
}
