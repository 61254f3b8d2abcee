package groups

import (
	"fmt"
	"io"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

// WriteJSON writes r as one indented JSON document: every field of Result
// (groups with their summaries, pairs with all tests and effect sizes,
// curves, pooled distributions, the input samples, settings, notes) with
// the json names given in the type definitions. Numbers keep full
// precision (shortest representation that round-trips); NaN and ±Inf,
// which JSON cannot hold, are written as null. Empty and nil lists are
// written as [], numbers and strings of a list on one line, structures one
// per line, two spaces per level, with a final newline.
func WriteJSON(w io.Writer, r Result) error {
	buf, err := jsonsafe.Marshal(r, jsonsafe.Options{Indent: "  ", NilAsEmpty: true})
	if err != nil {
		return fmt.Errorf("json: %w", err)
	}
	buf = append(buf, '\n')
	if _, err := w.Write(buf); err != nil {
		return fmt.Errorf("json: %w", err)
	}
	return nil
}
