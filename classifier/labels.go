package classifier

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/tracesift/tracesift/internal/echo"
)

// Classes are the labels a training row may carry.
var Classes = []string{"chaotic", "regular", "stochastic"}

// ErrLabels is wrapped by every error about a labels file.
var ErrLabels = errors.New("labels")

// Label is one row of a labels file: a trace path and its class.
type Label struct {
	Path  string // as written in the file
	Class string
	Line  int // 1-based line in the labels file
}

// ReadLabels parses a labels file: CSV with the header "file,class" (or
// "path,class"; case and surrounding spaces ignored), then one trace per
// line. Blank lines and lines starting with '#' are skipped. Classes must be
// chaotic, regular or stochastic; a duplicate path, an unknown class or a
// malformed row is an error naming the file and line. name labels errors.
// A file whose first 4 KiB look binary (see echo.Binary) is refused as
// such, and file content echoed in a message is cut to about 60
// characters.
func ReadLabels(r io.Reader, name string) ([]Label, error) {
	br := bufio.NewReaderSize(r, 64<<10)
	block, err := br.Peek(labelsSniffLen)
	if err != nil && err != io.EOF && err != bufio.ErrBufferFull {
		return nil, fmt.Errorf("%s: %w: %v", name, ErrLabels, err)
	}
	if echo.Binary(block, false) {
		return nil, fmt.Errorf("%s: %w: looks binary (not delimited text); want CSV text with the header \"file,class\"", name, ErrLabels)
	}
	sc := bufio.NewScanner(br)
	sc.Buffer(make([]byte, 64<<10), 1<<20)
	var out []Label
	seen := map[string]int{}
	header := false
	for line := 1; sc.Scan(); line++ {
		text := strings.TrimSpace(strings.TrimPrefix(sc.Text(), "\ufeff"))
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		fields := splitLabelRow(text)
		if !header {
			if len(fields) != 2 || !(strings.EqualFold(fields[0], "file") || strings.EqualFold(fields[0], "path")) || !strings.EqualFold(fields[1], "class") {
				return nil, fmt.Errorf("%s line %d: %w: want the header \"file,class\", got %s", name, line, ErrLabels, echo.Quote(text))
			}
			header = true
			continue
		}
		if len(fields) != 2 {
			return nil, fmt.Errorf("%s line %d: %w: want 2 fields (file,class), got %d", name, line, ErrLabels, len(fields))
		}
		path, class := fields[0], strings.ToLower(fields[1])
		if path == "" {
			return nil, fmt.Errorf("%s line %d: %w: empty file name", name, line, ErrLabels)
		}
		if !isClass(class) {
			return nil, fmt.Errorf("%s line %d: %w: unknown class %s; valid classes: %s", name, line, ErrLabels, echo.Quote(fields[1]), strings.Join(Classes, ", "))
		}
		if prev, dup := seen[path]; dup {
			return nil, fmt.Errorf("%s line %d: %w: %s already labelled on line %d", name, line, ErrLabels, echoPath(path), prev)
		}
		seen[path] = line
		out = append(out, Label{Path: path, Class: class, Line: line})
	}
	if err := sc.Err(); err != nil {
		return nil, fmt.Errorf("%s: %w: %v", name, ErrLabels, err)
	}
	if !header {
		return nil, fmt.Errorf("%s: %w: empty file (want the header \"file,class\" and one row per trace)", name, ErrLabels)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("%s: %w: header but no labelled traces", name, ErrLabels)
	}
	return out, nil
}

func isClass(c string) bool {
	for _, k := range Classes {
		if c == k {
			return true
		}
	}
	return false
}

// splitLabelRow splits a CSV row on commas, honouring double quotes.
func splitLabelRow(s string) []string {
	var out []string
	var b strings.Builder
	quoted := false
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '"' && quoted && i+1 < len(s) && s[i+1] == '"':
			b.WriteByte('"')
			i++
		case c == '"':
			quoted = !quoted
		case c == ',' && !quoted:
			out = append(out, strings.TrimSpace(b.String()))
			b.Reset()
		default:
			b.WriteByte(c)
		}
	}
	return append(out, strings.TrimSpace(b.String()))
}

// labelsSniffLen is the size of the first block of a labels file that
// echo.Binary examines.
const labelsSniffLen = 4096

// echoPath renders a path for a message: as it is (cut by echo.Clip) when it is
// printable UTF-8, else quoted (by echo.Quote).
func echoPath(s string) string {
	if !utf8.ValidString(s) || strings.IndexFunc(s, func(r rune) bool { return !unicode.IsPrint(r) }) >= 0 {
		return echo.Quote(s)
	}
	return echo.Clip(s)
}
