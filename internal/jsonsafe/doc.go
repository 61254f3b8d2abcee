// Package jsonsafe writes JSON in which the floating-point values NaN, +Inf
// and −Inf, which JSON cannot represent and encoding/json refuses, appear
// as null, so that an undefined metric never breaks a document or a JSON
// Lines stream.
//
// It offers two tools:
//
//   - Float, a float64 whose MarshalJSON writes null for NaN and ±Inf and
//     the shortest decimal that round-trips otherwise, and whose
//     UnmarshalJSON reads null back as NaN. Use it as a field type in
//     structures handed to encoding/json.
//   - Marshal, a small reflective encoder for result structures that keep
//     plain float64 fields. Its Options choose compact or indented output and
//     whether nil slices and maps are written as null or as [] and {}.
//
// Every finite float is written by strconv.AppendFloat(dst, f, 'g', -1, 64):
// the shortest decimal that parses back to the same float64, in exponent
// form when the decimal exponent is below −4 or at least 6 (1e-05, 1e+06),
// where encoding/json would write 0.00001 and 1000000. Both forms are valid
// JSON and decode to the same value.
package jsonsafe
