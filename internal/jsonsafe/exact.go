package jsonsafe

import (
	"fmt"
	"math"
	"strconv"
)

// Exact is a float64 that survives a JSON round trip whatever its value:
// finite values as the shortest decimal that reads back to the same bits
// (as Float writes them), NaN as null, +Inf and −Inf as the strings "+Inf"
// and "-Inf". Use it where a value written to JSON must be read back
// unchanged (a journal), and Float where readers expect numbers or null.
type Exact float64

// MarshalJSON writes e as described on the type.
func (e Exact) MarshalJSON() ([]byte, error) {
	f := float64(e)
	switch {
	case math.IsInf(f, 1):
		return []byte(`"+Inf"`), nil
	case math.IsInf(f, -1):
		return []byte(`"-Inf"`), nil
	}
	return appendFloat(nil, f), nil
}

// UnmarshalJSON reads what MarshalJSON writes.
func (e *Exact) UnmarshalJSON(b []byte) error {
	switch string(b) {
	case "null":
		*e = Exact(math.NaN())
		return nil
	case `"+Inf"`:
		*e = Exact(math.Inf(1))
		return nil
	case `"-Inf"`:
		*e = Exact(math.Inf(-1))
		return nil
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil || len(b) == 0 || b[0] == '"' {
		return fmt.Errorf("jsonsafe: %q is not a number, null, \"+Inf\" or \"-Inf\"", b)
	}
	*e = Exact(v)
	return nil
}
