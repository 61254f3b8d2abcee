package trace

import (
	"bytes"
	"fmt"
	"math"
	"strings"

	"github.com/tracesift/tracesift/internal/echo"
)

// Detection limits.
const (
	// detectRun is how many consecutive numeric rows of one shape mark the
	// start of the table.
	detectRun = 5
	// detectMaxLines and detectMaxBytes bound the look-ahead spent finding
	// the table.
	detectMaxLines = 10000
	detectMaxBytes = 16 << 20
)

type lineKind uint8

const (
	kBlank   lineKind = iota
	kComment          // starts with #, % or //
	kSemi             // starts with ';': a comment unless the table is ';'-delimited
	kContent
)

// shape is the layout of a numeric row: its delimiter and field count.
type shape struct {
	delim  byte
	fields int
}

// probe is one buffered line seen while looking for the table.
type probe struct {
	num     int
	text    []byte
	kind    lineKind
	numeric bool  // every field a number or missing, at least one number
	sh      shape // valid when numeric
}

// column accumulates one parsed column of the table.
type column struct {
	idx     int // 0-based field index
	vals    []float64
	bad     int    // non-finite or missing values
	badLine int    // line of the first one
	badText string // its field text, quoted
	// time-axis tracking (col 1 only)
	time       bool
	increasing bool
	breakLine  int // first line where strict increase fails
	prev       float64
	res        []int16 // printed resolution of each stamp (base-10 exponent)
}

// textReader parses one delimited-text input.
type textReader struct {
	name string
	cfg  config
	lr   *lineReader
	size int64 // input size in bytes if known, else -1

	// table layout
	delim    byte
	decComma bool
	nf       int  // fields per row
	trail    bool // rows may end with one extra empty field (trailing delimiter)
	first    int  // line of the first data row
	header   []string
	hdrLine  int

	// column plan
	cols      []column // 1 or 2 entries
	sel       int      // 1-based value column; 0 = col 1 or 2, decided at the end
	timeCand  bool     // column 1 may be the time axis
	timeNamed bool     // its header names a time axis

	fields   [][]byte
	alt      [][]byte // fields of a ragged row under another delimiter
	rows     int
	capHint  int    // expected rows, from the input size
	indexCol bool   // column 1 is a sample counter by its header
	pending  *Error // first invalid row of a possible footer
	warnings []string
}

func kindOf(b []byte) lineKind {
	i := 0
	for i < len(b) && (isBlank(b[i]) || b[i] == '\v' || b[i] == '\f') {
		i++
	}
	if i == len(b) {
		return kBlank
	}
	if onlyDelims(b[i:]) {
		return kBlank // ",,," rows of spreadsheet exports
	}
	switch b[i] {
	case '#', '%':
		return kComment
	case '/':
		if i+1 < len(b) && b[i+1] == '/' {
			return kComment
		}
	case ';':
		return kSemi
	}
	return kContent
}

// onlyDelims reports whether b holds nothing but delimiters and blanks.
func onlyDelims(b []byte) bool {
	for _, c := range b {
		switch c {
		case ',', ';', ' ', '\t', '\v', '\f':
		default:
			return false
		}
	}
	return true
}

// allMissing reports whether every field of b in the table's layout is a
// missing-value token ("NA;NA").
func (p *textReader) allMissing(b []byte) bool {
	if p.count(b) != p.nf {
		return false
	}
	for _, f := range p.fields {
		if !isMissing(f) {
			return false
		}
	}
	return true
}

// numericShape decides whether a line is a numeric row and under which
// delimiter: the first of ';', tab, ',' present in the line, then
// whitespace, under which every field is a number or missing and at least
// one is a number. Lines starting with ';' are only tried with ';'.
func (p *textReader) numericShape(b []byte, k lineKind) (shape, bool) {
	try := func(d byte) bool {
		p.fields = splitFields(b, d, p.fields)
		num := 0
		for _, f := range p.fields {
			_, c := parseField(f, d != ',')
			switch c {
			case tokText:
				return false
			case tokNumber:
				num++
			}
		}
		return num > 0
	}
	if k == kSemi {
		if try(';') {
			return shape{';', len(p.fields)}, true
		}
		return shape{}, false
	}
	for _, d := range [...]byte{';', '\t', ','} {
		if bytes.IndexByte(b, d) >= 0 && try(d) {
			return shape{d, len(p.fields)}, true
		}
	}
	if try(wsDelim) {
		return shape{wsDelim, len(p.fields)}, true
	}
	return shape{}, false
}

// read parses the whole input.
func (p *textReader) read() (Trace, error) {
	probes, start, err := p.detect()
	if err != nil {
		return Trace{}, err
	}
	if err := p.plan(); err != nil {
		return Trace{}, err
	}
	for _, pr := range probes[start:] {
		if err := p.row(pr.num, pr.text); err != nil {
			return Trace{}, err
		}
	}
	probes = nil
	for {
		b, ok, err := p.lr.next()
		if err != nil {
			return Trace{}, err
		}
		if !ok {
			break
		}
		if err := p.row(p.lr.num, b); err != nil {
			return Trace{}, err
		}
	}
	return p.finish()
}

// detect buffers lines until the table is found and fixes its layout. It
// returns the buffered lines and the index of the first data row in them.
func (p *textReader) detect() ([]probe, int, error) {
	var probes []probe
	var bytesSeen int
	runStart, runLen := -1, 0
	var runShape shape
	bestStart, bestLen := -1, 0
	found := false
	for !found && len(probes) < detectMaxLines && bytesSeen < detectMaxBytes {
		b, ok, err := p.lr.next()
		if err != nil {
			return nil, 0, err
		}
		if !ok {
			break
		}
		if bytes.IndexByte(b, 0) >= 0 {
			// The first block passed sniff; binary further on.
			return nil, 0, &Error{File: p.name, Line: p.lr.num, Err: ErrBinary, Detail: "NUL bytes in the line"}
		}
		bytesSeen += len(b)
		pr := probe{num: p.lr.num, text: bytes.Clone(b), kind: kindOf(b)}
		if pr.kind == kContent || pr.kind == kSemi {
			pr.sh, pr.numeric = p.numericShape(pr.text, pr.kind)
		}
		probes = append(probes, pr)
		switch {
		case pr.kind == kBlank || pr.kind == kComment || (pr.kind == kSemi && !pr.numeric):
			continue
		case !pr.numeric:
			runLen = 0
			continue
		case runLen > 0 && pr.sh == runShape:
			runLen++
		default:
			runStart, runLen, runShape = len(probes)-1, 1, pr.sh
		}
		if runLen > bestLen {
			bestStart, bestLen = runStart, runLen
		}
		found = runLen >= detectRun
	}
	if bestLen == 0 {
		return nil, 0, p.noTable(probes)
	}
	s := bestStart
	sh := probes[s].sh
	p.delim, p.nf, p.decComma = sh.delim, sh.fields, sh.delim != ','

	// A trailing delimiter on every row of the run ("1;2;") is a line
	// terminator, not an empty column.
	if p.delim != wsDelim && p.nf > 1 {
		p.trail = true
		for i, n := s, 0; i < len(probes) && n < bestLen; i++ {
			if !probes[i].numeric || probes[i].sh != sh {
				continue
			}
			n++
			f := splitFields(probes[i].text, p.delim, p.fields)
			p.fields = f
			if len(f[len(f)-1]) != 0 {
				p.trail = false
				break
			}
		}
		if p.trail {
			p.nf--
		}
	}

	// Walk back over the lines before the run: a numeric row of the same
	// shape further up means the table started there and the rows between
	// are broken (they will be reported); a non-numeric line with another
	// field count ends the walk.
	t := s
	for i := s - 1; i >= 0; i-- {
		pr := probes[i]
		if pr.kind == kBlank || p.isComment(pr.kind) {
			continue
		}
		if pr.numeric {
			if pr.sh.delim == sh.delim && p.count(pr.text) == p.nf {
				t = i
			}
			continue
		}
		if p.count(pr.text) != p.nf {
			break
		}
	}
	// Rows of missing values only ("NA") right above the table are data.
	for i := t - 1; i >= 0; i-- {
		pr := probes[i]
		if pr.kind == kBlank || p.isComment(pr.kind) {
			continue
		}
		if pr.numeric || !p.allMissing(pr.text) {
			break
		}
		t = i
	}
	p.first = probes[t].num

	// Header: the first content line above the table, if it has the
	// table's field count and no field is a number.
	for i := t - 1; i >= 0; i-- {
		pr := probes[i]
		if pr.kind == kBlank || p.isComment(pr.kind) {
			continue
		}
		if !pr.numeric {
			p.takeHeader(pr)
		}
		break
	}

	// Numeric lines skipped before the table are worth a word.
	n, lo, hi := 0, 0, 0
	for _, pr := range probes[:t] {
		if pr.numeric && !p.isComment(pr.kind) {
			if n == 0 {
				lo = pr.num
			}
			n, hi = n+1, pr.num
		}
	}
	if n > 0 {
		p.warn("ignored %d numeric line(s) before the table (lines %d–%d)", n, lo, hi)
	}

	// Preallocate from the input size when known.
	if p.size > 0 {
		avg := 0
		for _, pr := range probes[t:] {
			avg += len(pr.text) + 1
		}
		avg /= len(probes) - t
		p.capHint = int(min(p.size/int64(max(avg, 1))+16, int64(p.cfg.maxN)))
	}
	return probes, t, nil
}

func (p *textReader) isComment(k lineKind) bool {
	return k == kComment || (k == kSemi && p.delim != ';')
}

// count returns the number of fields of b in the table's layout.
func (p *textReader) count(b []byte) int {
	p.fields = splitFields(b, p.delim, p.fields)
	n := len(p.fields)
	if p.trail && n == p.nf+1 && len(p.fields[n-1]) == 0 {
		n--
	}
	return n
}

// takeHeader adopts pr as the header row when its shape fits.
func (p *textReader) takeHeader(pr probe) {
	f := splitFields(pr.text, p.delim, p.fields)
	if p.delim == wsDelim && len(f) != p.nf {
		// Names with spaces in a blank-separated table: a single column
		// is the whole line; several are separated by tabs or 2+ spaces.
		f = splitWide(pr.text, f)
	}
	p.fields = f
	for _, x := range f {
		if _, c := parseField(x, p.decComma); c == tokNumber {
			return
		}
	}
	n := len(f)
	switch {
	case n == p.nf:
	case p.trail && n == p.nf+1 && len(f[n-1]) == 0:
		n--
	case p.trail && n == p.nf+1:
		// The header names the last column, so the empty fields of the
		// rows are a real (empty) column, not a trailing delimiter.
		p.trail = false
		p.nf++
	default:
		return
	}
	p.header = make([]string, n)
	for i := range n {
		p.header[i] = headerName(f[i])
	}
	p.hdrLine = pr.num
}

// splitWide splits a line at tabs and at runs of two or more spaces
// ("Time (s)   Id (A)" → two fields), appending to dst[:0]. Quoted fields
// lose their quotes.
func splitWide(line []byte, dst [][]byte) [][]byte {
	dst = dst[:0]
	line = trimBlank(line)
	start := 0
	for i := 0; i <= len(line); i++ {
		end := i == len(line)
		if !end && !(line[i] == '\t' || line[i] == ' ' && i+1 < len(line) && line[i+1] == ' ') {
			continue
		}
		f := trimBlank(line[start:i])
		if len(f) >= 2 && f[0] == '"' && f[len(f)-1] == '"' {
			f = f[1 : len(f)-1]
		}
		if len(f) > 0 || end {
			dst = append(dst, f)
		}
		for i < len(line) && isBlank(line[i]) {
			i++
		}
		start = i
		i--
		if end {
			break
		}
	}
	return dst
}

// noTable explains an input in which no line is numeric.
func (p *textReader) noTable(probes []probe) error {
	last := -1
	for i, pr := range probes {
		if pr.kind == kContent {
			last = i
		}
	}
	if last < 0 {
		return &Error{File: p.name, Err: ErrEmpty,
			Detail: "the input is empty or holds only comments and blank lines"}
	}
	if len(probes) >= detectMaxLines {
		return &Error{File: p.name, Line: probes[0].num, Err: ErrNotNumeric,
			Detail: fmt.Sprintf("no line of the first %d is a row of numbers", len(probes))}
	}
	// A field that starts like a number but does not parse is the likely
	// culprit; prefer the last such line (data rows come last).
	for i := last; i >= 0; i-- {
		pr := probes[i]
		if pr.kind != kContent {
			continue
		}
		d := byte(wsDelim)
		for _, c := range [...]byte{';', '\t', ','} {
			if bytes.IndexByte(pr.text, c) >= 0 {
				d = c
				break
			}
		}
		for j, f := range splitFields(pr.text, d, nil) {
			if len(f) == 0 {
				continue
			}
			c := f[0]
			if c >= '0' && c <= '9' || c == '-' || c == '+' || c == '.' {
				if _, cls := parseField(f, d != ','); cls == tokText {
					return &Error{File: p.name, Line: pr.num, Column: j + 1, Err: ErrNotNumeric,
						Detail: quoteField(f) + " (no line of the input is a row of numbers)"}
				}
			}
		}
	}
	return &Error{File: p.name, Line: probes[last].num, Err: ErrHeaderOnly,
		Detail: quoteField(probes[last].text)}
}

func (p *textReader) warn(format string, a ...any) {
	p.warnings = append(p.warnings, fmt.Sprintf(format, a...))
}

// columnName returns the header text of 1-based column c, or "".
func (p *textReader) columnName(c int) string {
	if p.header == nil || c < 1 || c > len(p.header) {
		return ""
	}
	return p.header[c-1]
}

// available lists the columns for ErrNoColumn messages.
func (p *textReader) available() string {
	if p.header == nil {
		return fmt.Sprintf("the table has %d column(s) and no header, so choose by number 1–%d", p.nf, p.nf)
	}
	const most = 12 // names listed; a wide table's list stays one readable line
	var b strings.Builder
	b.WriteString("available:")
	for i, h := range p.header[:min(len(p.header), most)] {
		if i > 0 {
			b.WriteByte(',')
		}
		fmt.Fprintf(&b, " %d %s", i+1, echo.Quote(h))
	}
	if len(p.header) > most {
		fmt.Fprintf(&b, " and %d more", len(p.header)-most)
	}
	return b.String()
}

// plan decides which columns to parse: the value column and, when column
// 1 may be a time axis, column 1.
func (p *textReader) plan() error {
	line := p.hdrLine
	if line == 0 {
		line = p.first
	}
	switch {
	case p.cfg.colIndex > 0:
		if p.cfg.colIndex > p.nf {
			return &Error{File: p.name, Line: line, Err: ErrNoColumn,
				Detail: fmt.Sprintf("column %d; %s", p.cfg.colIndex, p.available())}
		}
		p.sel = p.cfg.colIndex
	case p.cfg.colName != "":
		if p.header == nil {
			return &Error{File: p.name, Line: line, Err: ErrNoColumn,
				Detail: fmt.Sprintf("%q: %s", p.cfg.colName, p.available())}
		}
		p.sel = p.findColumn(p.cfg.colName)
		if p.sel == 0 {
			return &Error{File: p.name, Line: line, Err: ErrNoColumn,
				Detail: fmt.Sprintf("%q; %s", p.cfg.colName, p.available())}
		}
	}
	first, unit := "", ""
	if p.header != nil {
		first, unit = splitUnit(p.header[0])
	}
	if p.nf >= 2 && p.sel != 1 {
		if p.header != nil && isIndexName(first) && !isTimeName(first) {
			p.indexCol = true
		} else {
			p.timeCand = true
			p.timeNamed = p.header != nil && (isTimeName(first) || isTimeUnit(unit))
		}
	}
	if p.sel == 0 {
		switch {
		case p.nf == 1:
			p.sel = 1
		case p.timeNamed || p.indexCol:
			p.sel = 2
		}
	}
	add := func(idx int, time bool) {
		p.cols = append(p.cols, column{idx: idx, time: time, increasing: time,
			vals: make([]float64, 0, p.capHint)})
		if time {
			p.cols[len(p.cols)-1].res = make([]int16, 0, p.capHint)
		}
	}
	if p.timeCand {
		add(0, true)
	}
	switch {
	case p.sel == 0:
		add(1, false)
	case p.sel == 1:
		if !p.timeCand {
			add(0, false)
		}
	default:
		add(p.sel-1, false)
	}
	return nil
}

// findColumn matches a header name: whole field exactly, name without
// unit exactly, then both ignoring case. It returns the 1-based column or 0.
func (p *textReader) findColumn(want string) int {
	want = strings.TrimSpace(want)
	match := func(eq func(a, b string) bool) int {
		hit := 0
		for i, h := range p.header {
			n, _ := splitUnit(h)
			if eq(h, want) || eq(n, want) {
				if hit == 0 {
					hit = i + 1
				} else {
					p.warn("several columns are named %q; using column %d", want, hit)
					break
				}
			}
		}
		return hit
	}
	if c := match(func(a, b string) bool { return a == b }); c > 0 {
		return c
	}
	return match(strings.EqualFold)
}

// row parses one line of the table.
func (p *textReader) row(num int, line []byte) error {
	if k := kindOf(line); k == kBlank || p.isComment(k) {
		return nil
	}
	f := splitFields(line, p.delim, p.fields)
	p.fields = f
	n := len(f)
	if p.trail && n == p.nf+1 && len(f[n-1]) == 0 {
		n--
	}
	if n != p.nf {
		return p.invalid(f, p.ragged(num, line, n))
	}
	var vs [2]float64
	for k := range p.cols {
		c := &p.cols[k]
		b := f[c.idx]
		v, cls := parseField(b, p.decComma)
		if cls == tokText {
			return p.invalid(f, &Error{File: p.name, Line: num, Column: c.idx + 1,
				Name: p.columnName(c.idx + 1), Err: ErrNotNumeric, Detail: quoteField(b)})
		}
		vs[k] = v
	}
	if p.pending != nil {
		return p.pending
	}
	if p.rows >= p.cfg.maxN {
		return &Error{File: p.name, Line: num, Err: ErrTooLarge, Count: p.cfg.maxN + 1, Limit: p.cfg.maxN,
			Detail: fmt.Sprintf("more than %d samples (the MaxSamples limit)", p.cfg.maxN)}
	}
	p.rows++
	for k := range p.cols {
		c := &p.cols[k]
		v := vs[k]
		c.vals = append(c.vals, v)
		finite := !math.IsNaN(v) && !math.IsInf(v, 0)
		if !finite {
			if c.bad == 0 {
				c.badLine, c.badText = num, quoteField(f[c.idx])
			}
			c.bad++
		}
		if c.time && c.increasing {
			if !finite || (len(c.vals) > 1 && !(v > c.prev)) {
				c.increasing, c.breakLine = false, num
				c.res = nil
			} else {
				c.res = append(c.res, decimalResolution(f[c.idx]))
			}
			c.prev = v
		}
	}
	return nil
}

// ragged returns the ErrRagged error for line num, which has n fields.
// When the line is no row of numbers under the table's delimiter but is
// one of the table's width under another (a file pasted together from two
// exports), the message names both delimiters.
func (p *textReader) ragged(num int, line []byte, n int) *Error {
	detail := fmt.Sprintf("%d %s where the table has %d", n, plural(n, "field"), p.nf)
	if d, ok := p.otherDelim(line); ok {
		detail += fmt.Sprintf(" (this line seems to use %s where the file uses %s)", delimName(d), delimName(p.delim))
	} else {
		detail += fmt.Sprintf(" (as from line %d)", p.first)
	}
	return &Error{File: p.name, Line: num, Err: ErrRagged, Detail: detail}
}

// otherDelim returns the delimiter other than the table's under which line
// is a numeric row (see numericShape) of the table's field count. A line
// that is a numeric row under the table's own delimiter is a row with a
// field too few or too many, not another layout: with decimal commas,
// "1,5" in a ';' table is one value, not two.
func (p *textReader) otherDelim(line []byte) (byte, bool) {
	if _, ok := p.numericUnder(line, p.delim); ok {
		return 0, false
	}
	for _, d := range [...]byte{',', ';', '\t', wsDelim} {
		if d == p.delim || d != wsDelim && bytes.IndexByte(line, d) < 0 {
			continue
		}
		if n, ok := p.numericUnder(line, d); ok && n == p.nf {
			return d, true
		}
	}
	return 0, false
}

// numericUnder splits line by d (into p.alt, leaving p.fields alone) and
// returns its field count, not counting a trailing empty field when the
// table's rows end with a delimiter, and whether every field is a number
// or missing and at least one is a number.
func (p *textReader) numericUnder(line []byte, d byte) (int, bool) {
	p.alt = splitFields(line, d, p.alt)
	f := p.alt
	n := len(f)
	if p.trail && n == p.nf+1 && len(f[n-1]) == 0 {
		n--
	}
	num := 0
	for _, x := range f {
		switch _, c := parseField(x, d != ','); c {
		case tokText:
			return n, false
		case tokNumber:
			num++
		}
	}
	return n, num > 0
}

// delimName names a delimiter in a message.
func delimName(d byte) string {
	switch d {
	case '\t':
		return "tabs"
	case wsDelim:
		return "spaces"
	}
	return "'" + string(d) + "'"
}

// invalid handles a row that is ragged or not numeric: it is an error,
// unless it and every line after it look like a text footer ("END",
// "Total: 1000"), which is then ignored with a warning.
func (p *textReader) invalid(f [][]byte, e *Error) error {
	if len(f) > 0 && len(f[0]) > 0 {
		c := f[0][0]
		if (c|0x20 >= 'a' && c|0x20 <= 'z') || c >= 0x80 {
			if _, cls := parseField(f[0], p.decComma); cls == tokText {
				if p.pending == nil {
					p.pending = e
				}
				return nil
			}
		}
	}
	if p.pending != nil {
		return p.pending
	}
	return e
}

// finish turns the parsed columns into a Trace.
func (p *textReader) finish() (Trace, error) {
	if p.pending != nil {
		p.warn("ignored the text lines from line %d to the end (a footer?)", p.pending.Line)
	}
	tr := Trace{Source: p.name, Format: FormatCSV, Columns: p.nf, FirstLine: p.first}
	// plan made cols = [time candidate, value] or [value].
	var tcol, vcol *column
	if p.timeCand {
		tcol, vcol = &p.cols[0], &p.cols[1]
	} else {
		vcol = &p.cols[0]
	}
	timeOK := tcol != nil && tcol.increasing && len(tcol.vals) >= 2
	if p.sel == 0 {
		if timeOK {
			p.sel = 2
		} else {
			p.sel, vcol, tcol = 1, tcol, nil
		}
	}
	if tcol != nil && !timeOK {
		if p.timeNamed {
			where := ""
			if tcol.breakLine > 0 {
				where = fmt.Sprintf(" (line %d)", tcol.breakLine)
			}
			p.warn("time column 1 (%q) is not strictly increasing%s; no sample interval derived", p.columnName(1), where)
		}
		tcol = nil
	}
	excluded := 0
	if tcol != nil || p.timeNamed || p.indexCol {
		excluded = 1
	}
	if p.cfg.colIndex == 0 && p.cfg.colName == "" && p.nf-excluded > 1 {
		name := ""
		if h := p.columnName(p.sel); h != "" {
			name = fmt.Sprintf(" (%q)", h)
		}
		p.warn("using column %d%s of %d value columns; choose another with --column", p.sel, name, p.nf-excluded)
	}
	tr.ColumnIndex = p.sel
	if h := p.columnName(p.sel); h != "" {
		tr.Column, tr.Unit = splitUnit(h)
	}
	var times []float64
	if tcol != nil {
		tr.TimeColumn = 1
		if h := p.columnName(1); h != "" {
			_, tr.TimeUnit = splitUnit(h)
		}
		times = tcol.vals
	}
	if p.rows == 0 { // only possible if every table row became a footer
		return tr, &Error{File: p.name, Line: p.first, Err: ErrHeaderOnly, Detail: "no valid data rows"}
	}
	tr.Values = vcol.vals
	tr.Warnings = p.warnings
	bad := badInfo{count: vcol.bad, line: vcol.badLine, text: vcol.badText,
		column: p.sel, name: p.columnName(p.sel)}
	var res []int16
	if tcol != nil {
		res = tcol.res
	}
	err := finish(&tr, times, res, bad, p.cfg)
	if e, ok := err.(*Error); ok && e.Err == ErrConstant && p.delim == ',' && p.nf == 2 && p.header == nil {
		e.Detail += " (if the commas are decimal commas, export with ';' or tab as the delimiter)"
	}
	if e, ok := err.(*Error); ok && e.Err == ErrTooShort && p.rows == 1 && p.nf > 2 {
		e.Detail += fmt.Sprintf(" (the data are one row of %d values; put one value per line)", p.nf)
	}
	return tr, err
}
