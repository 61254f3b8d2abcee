package visibility

// edgeLog is the append-only log of the natural-visibility sweeps: per sweep,
// the distances between successive visible samples (the first one measured
// from the apex), each ≥ 1, as unsigned LEB128 varints, and a 0 byte closing
// the record. Visible samples cluster near the apex, so most distances take
// one byte: the log costs about 1.1 bytes per edge, against 8 for a list of
// index pairs, which matters because fresh memory is slow to touch. It is
// stored in chunks that grow to logChunkMax bytes, so appending never copies.
type edgeLog struct {
	cur    []byte   // the chunk being filled
	chunks [][]byte // the filled chunks before cur
}

const (
	logChunkMin = 1 << 12
	logChunkMax = 1 << 20
)

func (l *edgeLog) init() { l.cur = make([]byte, 0, logChunkMin) }

// put appends the distance d ≥ 1.
func (l *edgeLog) put(d uint32) {
	if d < 0x80 && len(l.cur) < cap(l.cur) {
		l.cur = append(l.cur, byte(d))
		return
	}
	l.putSlow(d)
}

// end closes the current record.
func (l *edgeLog) end() {
	if len(l.cur) < cap(l.cur) {
		l.cur = append(l.cur, 0)
		return
	}
	l.putSlow(0)
}

//go:noinline
func (l *edgeLog) putSlow(d uint32) {
	if cap(l.cur)-len(l.cur) < 5 {
		// A varint never straddles two chunks.
		l.chunks = append(l.chunks, l.cur)
		l.cur = make([]byte, 0, min(2*cap(l.cur), logChunkMax))
	}
	for d >= 0x80 {
		l.cur = append(l.cur, byte(d)|0x80)
		d >>= 7
	}
	l.cur = append(l.cur, byte(d))
}

// logReader reads an edgeLog from the start, releasing chunks once read.
type logReader struct {
	l   *edgeLog
	buf []byte
	k   int // index of buf in l.chunks; len(l.chunks) for l.cur
	pos int
}

func (l *edgeLog) reader() logReader {
	r := logReader{l: l}
	if len(l.chunks) > 0 {
		r.buf = l.chunks[0]
	} else {
		r.buf = l.cur
	}
	return r
}

// nextSlow returns the next distance, 0 at the end of a record. The reader
// (placeEdges) takes a one-byte distance in the current chunk itself, which
// is nearly every one, and calls nextSlow for the rest: a wrapper holding
// both would not fit the compiler's inlining budget, and this runs once per
// edge end.
//
//go:noinline
func (r *logReader) nextSlow() uint32 {
	if r.pos == len(r.buf) {
		// Move to the next chunk, letting the collector have this one.
		if r.k < len(r.l.chunks) {
			r.l.chunks[r.k] = nil
		}
		r.k++
		if r.k < len(r.l.chunks) {
			r.buf = r.l.chunks[r.k]
		} else {
			r.buf = r.l.cur
		}
		r.pos = 0
	}
	var d uint32
	for s := uint(0); ; s += 7 {
		b := r.buf[r.pos]
		r.pos++
		d |= uint32(b&0x7f) << s
		if b < 0x80 {
			return d
		}
	}
}
