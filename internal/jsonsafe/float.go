package jsonsafe

import (
	"math"
	"strconv"
)

// Float is a float64 that writes NaN and ±Inf as JSON null, so a document
// stays valid when a value is missing (an estimator that found no scaling
// region, an SNR of +Inf meaning "no noise"). Finite values are written as
// the shortest decimal that round-trips ('g' format, precision −1).
type Float float64

// MarshalJSON writes the shortest exact decimal form of f, or null when f
// is NaN or ±Inf.
func (f Float) MarshalJSON() ([]byte, error) {
	return appendFloat(nil, float64(f)), nil
}

// UnmarshalJSON reads a JSON number into f, or null as NaN. Anything else
// (a string, true) is an error from strconv.ParseFloat. Called directly
// rather than by encoding/json, it accepts whatever strconv.ParseFloat
// accepts (also "NaN", "Inf", hexadecimal floats).
func (f *Float) UnmarshalJSON(b []byte) error {
	if string(b) == "null" {
		*f = Float(math.NaN())
		return nil
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil {
		return err
	}
	*f = Float(v)
	return nil
}

// appendFloat appends f to dst as Float.MarshalJSON writes it: null for NaN
// and ±Inf, strconv 'g' with the shortest round-trip precision otherwise.
func appendFloat(dst []byte, f float64) []byte {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return append(dst, "null"...)
	}
	return strconv.AppendFloat(dst, f, 'g', -1, 64)
}
