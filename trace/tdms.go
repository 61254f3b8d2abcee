package trace

import (
	"encoding/binary"
	"fmt"
	"math"
	"strings"
)

// NI TDMS input, written from NI's published description "TDMS File
// Format Internal Structure" (National Instruments, updated 2024): a file
// is a sequence of segments, each a 28-byte lead-in (tag "TDSm", the ToC
// bit mask, always little-endian, the version 4712 or 4713, the length of
// the rest of the segment and the length of its meta data), the meta data
// (objects by path, each with a raw data index and properties) and the raw
// data (per chunk, each channel of the segment's object list in turn,
// contiguous or interleaved). Meta data may be left out of a segment when
// it has not changed; an object list carries over from segment to segment
// unless kTocNewObjList is set. The *.tdms_index file is not needed.

// ToC flags (the description's kToc* constants).
const (
	tocMetaData    = 1 << 1
	tocNewObjList  = 1 << 2
	tocRawData     = 1 << 3
	tocInterleaved = 1 << 5
	tocBigEndian   = 1 << 6
	tocDAQmx       = 1 << 7
)

// tdmsLeadIn is the length of a segment's lead-in.
const tdmsLeadIn = 28

// Raw data index markers.
const (
	tdmsNoData      = 0xFFFFFFFF
	tdmsSameIndex   = 0x00000000
	tdmsDAQmxFormat = 0x00001269
	tdmsDAQmxDigit  = 0x00001369
)

// tdsDataType values (the description's enum).
const (
	tdsI8 = iota + 1
	tdsI16
	tdsI32
	tdsI64
	tdsU8
	tdsU16
	tdsU32
	tdsU64
	tdsSingle
	tdsDouble
	tdsExtended
	tdsSingleUnit   = 0x19
	tdsDoubleUnit   = 0x1A
	tdsExtendedUnit = 0x1B
	tdsString       = 0x20
	tdsBoolean      = 0x21
	tdsTimeStamp    = 0x44
	tdsFixedPoint   = 0x4F
	tdsComplex8     = 0x08000C
	tdsComplex16    = 0x10000D
	tdsDAQmx        = 0xFFFFFFFF
)

// tdsSize is the stored size of a value of type t, 0 when unknown or
// variable (strings).
func tdsSize(t uint32) int {
	switch t {
	case tdsI8, tdsU8, tdsBoolean:
		return 1
	case tdsI16, tdsU16:
		return 2
	case tdsI32, tdsU32, tdsSingle, tdsSingleUnit:
		return 4
	case tdsI64, tdsU64, tdsDouble, tdsDoubleUnit, tdsComplex8:
		return 8
	case tdsTimeStamp, tdsComplex16:
		return 16
	}
	return 0
}

// tdsNumeric reports whether channel data of type t is read as samples.
func tdsNumeric(t uint32) bool {
	return t >= tdsI8 && t <= tdsDouble || t == tdsSingleUnit || t == tdsDoubleUnit || t == tdsBoolean
}

func tdsTypeName(t uint32) string {
	names := map[uint32]string{tdsExtended: "extended float", tdsExtendedUnit: "extended float with unit",
		tdsString: "string", tdsTimeStamp: "time stamp", tdsFixedPoint: "fixed point", tdsComplex8: "complex single",
		tdsComplex16: "complex double", tdsDAQmx: "DAQmx raw", 0: "void"}
	if n, ok := names[t]; ok {
		return n
	}
	return fmt.Sprintf("type 0x%X", t)
}

// tdmsIndex is an object's raw data index in one segment.
type tdmsIndex struct {
	typ   uint32
	n     uint64 // values per chunk
	bytes uint64 // per chunk, strings included
	daqmx bool
}

// tdmsObject is an object's state carried from segment to segment.
type tdmsObject struct {
	path    string
	index   tdmsIndex
	indexed bool // index set once
	active  bool // has raw data in the current segment
	listed  bool // is in the current object list
}

// tdmsChannel is what the reader keeps of a channel with data.
type tdmsChannel struct {
	name      string // "group/channel"
	typ       uint32
	increment float64
	unit      string
	listed    bool // has had a raw data index, so is in channels
}

// tdmsExtent is where one chunk's values of the chosen channel lie.
type tdmsExtent struct {
	off    int64
	count  uint64
	stride int64
	typ    uint32
	big    bool
}

// tdmsWalker parses the segments of a file in order.
type tdmsWalker struct {
	c        container
	cfg      config
	objects  map[string]*tdmsObject
	list     []*tdmsObject // the current segment's object list
	channels []*tdmsChannel
	byPath   map[string]*tdmsChannel
	warnings []string
	// chosen, when set, collects the extents of that channel.
	chosen  string
	extents []tdmsExtent
	total   uint64
}

// segErr is an error located in segment seg (1-based) at byte off.
func (w *tdmsWalker) segErr(seg int, off int64, sentinel error, format string, a ...any) error {
	return &Error{File: w.c.name, Segment: seg, Offset: off, HasOffset: true, Err: sentinel, Detail: fmt.Sprintf(format, a...)}
}

// walk parses every segment.
func (w *tdmsWalker) walk() error {
	w.objects, w.byPath, w.list = map[string]*tdmsObject{}, map[string]*tdmsChannel{}, nil
	off := int64(0)
	for seg := 1; off < w.c.size; seg++ {
		next, err := w.segment(seg, off)
		if err != nil {
			return err
		}
		off = next
	}
	return nil
}

// segment parses the segment at off and returns the offset of the next.
func (w *tdmsWalker) segment(seg int, off int64) (int64, error) {
	if w.c.size-off < tdmsLeadIn {
		return 0, w.segErr(seg, off, ErrTruncated, "lead-in cut off: %d of %d bytes", w.c.size-off, tdmsLeadIn)
	}
	lead, err := w.c.at(off, tdmsLeadIn, "lead-in")
	if err != nil {
		return 0, err
	}
	switch string(lead[:4]) {
	case "TDSm":
	case "TDSh":
		return 0, w.segErr(seg, off, ErrUnsupported, "tag \"TDSh\": this is a *.tdms_index file; give the *.tdms file it indexes")
	default:
		return 0, w.segErr(seg, off, ErrMalformed, "lead-in tag %s, want \"TDSm\"", quoteField(lead[:4]))
	}
	toc := binary.LittleEndian.Uint32(lead[4:]) // the ToC is always little-endian
	var bo binary.ByteOrder = binary.LittleEndian
	if toc&tocBigEndian != 0 {
		bo = binary.BigEndian
	}
	if v := bo.Uint32(lead[8:]); v != 4712 && v != 4713 {
		return 0, w.segErr(seg, off+8, ErrUnsupported, "TDMS version %d (4712 and 4713 are read)", v)
	}
	nextLen, metaLen := bo.Uint64(lead[12:]), bo.Uint64(lead[20:])
	body := off + tdmsLeadIn
	left := uint64(w.c.size - body)
	end := w.c.size
	switch {
	case nextLen == math.MaxUint64:
		w.warnings = append(w.warnings, fmt.Sprintf("segment %d was not closed by its writer (length 0xFF…FF); read to the end of the file", seg))
		nextLen = left
	case nextLen > left:
		return 0, w.segErr(seg, off+12, ErrTruncated, "the segment needs %d bytes after its lead-in, the file has %d left", nextLen, left)
	default:
		end = body + int64(nextLen)
	}
	if metaLen > nextLen {
		return 0, w.segErr(seg, off+20, ErrMalformed, "meta data length %d, more than the segment's %d bytes", metaLen, nextLen)
	}
	if toc&tocMetaData != 0 {
		meta, err := w.c.at(body, int64(metaLen), "meta data")
		if err != nil {
			return 0, err
		}
		if err := w.meta(seg, body, meta, bo, toc&tocNewObjList != 0); err != nil {
			return 0, err
		}
	}
	if toc&tocRawData != 0 {
		if err := w.raw(seg, body+int64(metaLen), end, toc, bo); err != nil {
			return 0, err
		}
	}
	return end, nil
}

// tdmsMeta reads the meta data of one segment.
type tdmsMeta struct {
	b   []byte
	pos int
	at  int64 // file offset of b[0]
	bo  binary.ByteOrder
	w   *tdmsWalker
	seg int
}

func (m *tdmsMeta) need(n uint64, what string) error {
	if n > uint64(len(m.b)-m.pos) {
		return m.w.segErr(m.seg, m.at+int64(m.pos), ErrMalformed, "%s needs %d bytes, the meta data has %d left", what, n, len(m.b)-m.pos)
	}
	return nil
}

func (m *tdmsMeta) u32(what string) (uint32, error) {
	if err := m.need(4, what); err != nil {
		return 0, err
	}
	v := m.bo.Uint32(m.b[m.pos:])
	m.pos += 4
	return v, nil
}

func (m *tdmsMeta) u64(what string) (uint64, error) {
	if err := m.need(8, what); err != nil {
		return 0, err
	}
	v := m.bo.Uint64(m.b[m.pos:])
	m.pos += 8
	return v, nil
}

func (m *tdmsMeta) str(what string) (string, error) {
	n, err := m.u32(what + " length")
	if err != nil {
		return "", err
	}
	if err := m.need(uint64(n), what); err != nil {
		return "", err
	}
	s := string(m.b[m.pos : m.pos+int(n)])
	m.pos += int(n)
	return s, nil
}

// meta parses the meta data b of segment seg found at offset at.
func (w *tdmsWalker) meta(seg int, at int64, b []byte, bo binary.ByteOrder, newList bool) error {
	m := &tdmsMeta{b: b, at: at, bo: bo, w: w, seg: seg}
	count, err := m.u32("number of objects")
	if err != nil {
		return err
	}
	if newList {
		for _, o := range w.list {
			o.active, o.listed = false, false
		}
		w.list = w.list[:0]
	}
	for range count {
		objAt := m.at + int64(m.pos)
		p, err := m.str("object path")
		if err != nil {
			return err
		}
		group, channel, err := parseTDMSPath(p)
		if err != nil {
			return w.segErr(seg, objAt, ErrMalformed, "object path %s: %v", quoteField([]byte(p)), err)
		}
		o := w.objects[p]
		if o == nil {
			o = &tdmsObject{path: p}
			w.objects[p] = o
		}
		if !o.listed {
			o.listed = true
			w.list = append(w.list, o)
		}
		idxAt := m.at + int64(m.pos)
		idx, err := m.u32("raw data index")
		if err != nil {
			return err
		}
		switch idx {
		case tdmsNoData:
			o.active = false
		case tdmsSameIndex:
			if !o.indexed {
				return w.segErr(seg, idxAt, ErrMalformed, "object %s reuses a raw data index it never had", quoteField([]byte(p)))
			}
			o.active = true
		case tdmsDAQmxFormat, tdmsDAQmxDigit:
			if err := m.skipDAQmx(); err != nil {
				return err
			}
			o.index, o.indexed, o.active = tdmsIndex{typ: tdsDAQmx, daqmx: true}, true, true
		default:
			if idx != 20 && idx != 28 {
				return w.segErr(seg, idxAt, ErrMalformed, "raw data index length %d (20, or 28 for strings)", idx)
			}
			typ, err := m.u32("data type")
			if err != nil {
				return err
			}
			dim, err := m.u32("array dimension")
			if err != nil {
				return err
			}
			n, err := m.u64("number of values")
			if err != nil {
				return err
			}
			if dim != 1 {
				return w.segErr(seg, idxAt+8, ErrMalformed, "array dimension %d (1 is the only valid value)", dim)
			}
			ix := tdmsIndex{typ: typ, n: n}
			if typ == tdsString {
				if idx != 28 {
					return w.segErr(seg, idxAt, ErrMalformed, "a string channel's raw data index must be 28 bytes long, not %d", idx)
				}
				if ix.bytes, err = m.u64("total size in bytes"); err != nil {
					return err
				}
			} else {
				size := tdsSize(typ)
				if size == 0 {
					return w.segErr(seg, idxAt+4, ErrUnsupported, "channel %s holds %s data, whose size is not known", quoteField([]byte(p)), tdsTypeName(typ))
				}
				if n > math.MaxUint64/uint64(size) {
					return w.segErr(seg, idxAt+12, ErrMalformed, "%d values of %d bytes overflow", n, size)
				}
				ix.bytes = n * uint64(size)
			}
			if o.indexed && o.index.typ != typ {
				return w.segErr(seg, idxAt+4, ErrMalformed, "channel %s changes its data type from %s to %s", quoteField([]byte(p)), tdsTypeName(o.index.typ), tdsTypeName(typ))
			}
			o.index, o.indexed, o.active = ix, true, true
		}
		var ch *tdmsChannel // properties are kept from the first sight on
		if channel != "" {
			if ch = w.byPath[p]; ch == nil {
				ch = &tdmsChannel{name: group + "/" + channel}
				w.byPath[p] = ch
			}
			if o.indexed && !ch.listed { // a channel with data, in order of its first index
				ch.listed, ch.typ = true, o.index.typ
				w.channels = append(w.channels, ch)
			}
		}
		nprops, err := m.u32("number of properties")
		if err != nil {
			return err
		}
		for range nprops {
			if err := m.property(ch); err != nil {
				return err
			}
		}
	}
	return nil
}

// property reads one property, keeping wf_increment and unit_string of
// channel ch (nil for other objects).
func (m *tdmsMeta) property(ch *tdmsChannel) error {
	name, err := m.str("property name")
	if err != nil {
		return err
	}
	typAt := m.at + int64(m.pos)
	typ, err := m.u32("property type")
	if err != nil {
		return err
	}
	if typ == tdsString {
		v, err := m.str("property value")
		if err != nil {
			return err
		}
		if ch != nil && name == "unit_string" {
			ch.unit = v
		}
		return nil
	}
	size := tdsSize(typ)
	if typ == tdsExtended || typ == tdsExtendedUnit {
		size = 16 // LabVIEW's 80-bit extended float, stored in 16 bytes (memory)
	}
	if size == 0 {
		return m.w.segErr(m.seg, typAt, ErrMalformed, "property %s has type %s, whose size is not known", quoteField([]byte(name)), tdsTypeName(typ))
	}
	if err := m.need(uint64(size), "property value"); err != nil {
		return err
	}
	if ch != nil && name == "wf_increment" && tdsNumeric(typ) {
		ch.increment = tdsValue(m.b[m.pos:], typ, m.bo)
	}
	m.pos += size
	return nil
}

// skipDAQmx steps over a DAQmx raw data index (after its marker): data
// type, dimension, chunk size, the format-changing scalers (5 × uint32
// each) and the raw data widths.
func (m *tdmsMeta) skipDAQmx() error {
	if err := m.need(16, "DAQmx raw data index"); err != nil {
		return err
	}
	m.pos += 16
	n, err := m.u32("DAQmx scaler count")
	if err != nil {
		return err
	}
	if err := m.need(uint64(n)*20, "DAQmx scalers"); err != nil {
		return err
	}
	m.pos += int(n) * 20
	k, err := m.u32("DAQmx raw data width count")
	if err != nil {
		return err
	}
	if err := m.need(uint64(k)*4, "DAQmx raw data widths"); err != nil {
		return err
	}
	m.pos += int(k) * 4
	return nil
}

// parseTDMSPath splits "/'group'/'channel'" (quotes inside names
// doubled) into its names; "/" is the file, "/'group'" a group.
func parseTDMSPath(p string) (group, channel string, err error) {
	if p == "/" {
		return "", "", nil
	}
	var names []string
	rest := p
	for rest != "" {
		if !strings.HasPrefix(rest, "/'") {
			return "", "", fmt.Errorf("want /'name' parts")
		}
		rest = rest[2:]
		var b strings.Builder
		for {
			i := strings.IndexByte(rest, '\'')
			if i < 0 {
				return "", "", fmt.Errorf("unclosed quote")
			}
			b.WriteString(rest[:i])
			rest = rest[i+1:]
			if strings.HasPrefix(rest, "'") {
				b.WriteByte('\'')
				rest = rest[1:]
				continue
			}
			break
		}
		names = append(names, b.String())
	}
	switch len(names) {
	case 1:
		return names[0], "", nil
	case 2:
		return names[0], names[1], nil
	}
	return "", "", fmt.Errorf("%d levels, at most 2 (group and channel)", len(names))
}

// raw lays out the raw data [start, end) of segment seg and records the
// extents of the chosen channel.
func (w *tdmsWalker) raw(seg int, start, end int64, toc uint32, bo binary.ByteOrder) error {
	var active []*tdmsObject
	chunk := uint64(0)
	for _, o := range w.list {
		if o.active && o.index.bytes > 0 || o.active && o.index.daqmx {
			active = append(active, o)
			chunk += o.index.bytes
		}
	}
	var target *tdmsObject
	for _, o := range active {
		if w.chosen != "" && o.path == w.chosen {
			target = o
		}
	}
	if len(active) == 0 {
		return nil
	}
	for _, o := range active {
		if o.index.daqmx || toc&tocDAQmx != 0 {
			if target != nil {
				return w.segErr(seg, start, ErrUnsupported, "DAQmx raw data (read the channel through NI software, or save it as a plain channel)")
			}
			return nil // nothing of the chosen channel here; the layout cannot be computed
		}
	}
	size := uint64(end - start)
	if chunk == 0 {
		return nil
	}
	chunks, rest := size/chunk, size%chunk
	if rest != 0 {
		w.warnings = append(w.warnings, fmt.Sprintf("segment %d: %d byte(s) after its last whole chunk of raw data ignored", seg, rest))
	}
	if target == nil || chunks == 0 {
		return nil
	}
	interleaved := toc&tocInterleaved != 0
	if interleaved {
		width := int64(0)
		for _, o := range active {
			if o.index.n != target.index.n || o.index.typ == tdsString {
				return w.segErr(seg, start, ErrMalformed, "interleaved raw data needs the same number of fixed-size values in every channel")
			}
			width += int64(tdsSize(o.index.typ))
		}
		pos := start
		for _, o := range active {
			if o == target {
				break
			}
			pos += int64(tdsSize(o.index.typ))
		}
		for range chunks {
			w.add(tdmsExtent{off: pos, count: target.index.n, stride: width, typ: target.index.typ, big: bo == binary.BigEndian})
			pos += width * int64(target.index.n)
		}
		return nil
	}
	pos := start
	for k := uint64(0); k < chunks; k++ {
		for _, o := range active {
			if o == target {
				w.add(tdmsExtent{off: pos, count: o.index.n, stride: int64(tdsSize(o.index.typ)), typ: o.index.typ, big: bo == binary.BigEndian})
			}
			pos += int64(o.index.bytes)
		}
	}
	return nil
}

func (w *tdmsWalker) add(e tdmsExtent) {
	w.extents = append(w.extents, e)
	w.total += e.count
}

// tdsValue decodes one value of numeric type t from b.
func tdsValue(b []byte, t uint32, bo binary.ByteOrder) float64 {
	switch t {
	case tdsI8:
		return float64(int8(b[0]))
	case tdsU8, tdsBoolean:
		return float64(b[0])
	case tdsI16:
		return float64(int16(bo.Uint16(b)))
	case tdsU16:
		return float64(bo.Uint16(b))
	case tdsI32:
		return float64(int32(bo.Uint32(b)))
	case tdsU32:
		return float64(bo.Uint32(b))
	case tdsI64:
		return float64(int64(bo.Uint64(b)))
	case tdsU64:
		return float64(bo.Uint64(b))
	case tdsSingle, tdsSingleUnit:
		return float64(math.Float32frombits(bo.Uint32(b)))
	}
	return math.Float64frombits(bo.Uint64(b))
}

// readTDMS reads one channel of a TDMS file: its values in segment order,
// wf_increment as the sampling interval (seconds) and unit_string as the
// unit.
func readTDMS(c container, cfg config) (Trace, error) {
	w := &tdmsWalker{c: c, cfg: cfg}
	if err := w.walk(); err != nil {
		return Trace{}, err
	}
	names := make([]string, 0, len(w.channels))
	for _, ch := range w.channels {
		names = append(names, ch.name)
	}
	pick := cfg
	if cfg.colName != "" && !strings.Contains(cfg.colName, "/") {
		// A bare channel name is enough when no other group has it.
		var hits []string
		for _, n := range names {
			if strings.EqualFold(n[strings.Index(n, "/")+1:], cfg.colName) {
				hits = append(hits, n)
			}
		}
		switch len(hits) {
		case 1:
			pick.colName = hits[0]
		case 0:
		default:
			return Trace{}, &Error{File: c.name, Err: ErrNoColumn,
				Detail: fmt.Sprintf("channel %q is in %d groups (%s); give it as group/channel", cfg.colName, len(hits), strings.Join(hits, ", "))}
		}
	}
	chosen, err := pickChannel(names, pick, c.name, "channel", "--column group/channel")
	if err != nil {
		return Trace{}, err
	}
	ch := w.channels[chosen.index]
	if !tdsNumeric(ch.typ) {
		return Trace{}, &Error{File: c.name, Err: ErrUnsupported,
			Detail: fmt.Sprintf("channel %q holds %s data, not numbers", ch.name, tdsTypeName(ch.typ))}
	}
	for p, q := range w.byPath {
		if q == ch {
			w.chosen = p
		}
	}
	w.warnings, w.channels = nil, nil
	if err := w.walk(); err != nil {
		return Trace{}, err
	}
	if w.total > uint64(cfg.maxN) {
		return Trace{}, tooMany(c.name, w.total, cfg)
	}
	vals := make([]float64, 0, w.total)
	for _, e := range w.extents {
		if e.count == 0 {
			continue
		}
		size := int64(tdsSize(e.typ))
		span := e.stride*int64(e.count-1) + size
		b, err := c.at(e.off, span, "raw data")
		if err != nil {
			return Trace{}, err
		}
		var bo binary.ByteOrder = binary.LittleEndian
		if e.big {
			bo = binary.BigEndian
		}
		for i := int64(0); i < int64(e.count); i++ {
			vals = append(vals, tdsValue(b[i*e.stride:], e.typ, bo))
		}
	}
	tr := Trace{Values: vals, Column: ch.name, Unit: ch.unit, ColumnIndex: chosen.index + 1, Columns: len(names), Warnings: w.warnings}
	if ch.increment > 0 && !math.IsInf(ch.increment, 0) {
		tr.Interval, tr.TimeUnit = ch.increment, "s"
	}
	if chosen.warning != "" {
		tr.Warnings = append(tr.Warnings, chosen.warning)
	}
	return tr, nil
}
