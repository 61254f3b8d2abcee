package surrogate

import (
	"encoding/json"
	"math"
)

// resultJSON is Result with the numbers that may be non-finite as pointers,
// so that NaN and ±Inf travel as JSON null.
type resultJSON struct {
	Stat        string    `json:"stat"`
	Observed    *float64  `json:"observed"`
	Mean        *float64  `json:"mean"`
	SD          *float64  `json:"sd"`
	Z           *float64  `json:"z"`
	P           *float64  `json:"p"`
	PUpper      *float64  `json:"p_upper"`
	PLower      *float64  `json:"p_lower"`
	PTwo        *float64  `json:"p_two"`
	PHolm       *float64  `json:"p_holm"`
	Side        Side      `json:"side"`
	Alpha       float64   `json:"alpha"`
	Significant bool      `json:"significant"`
	Method      Method    `json:"method"`
	Count       int       `json:"count"`
	Failed      int       `json:"failed"`
	Values      []float64 `json:"values"`
	Error       string    `json:"error,omitempty"`
	Warnings    []string  `json:"warnings,omitempty"`
}

func finite(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

func orNaN(p *float64) float64 {
	if p == nil {
		return math.NaN()
	}
	return *p
}

// MarshalJSON writes r with non-finite numbers as null (encoding/json
// rejects NaN and Inf).
func (r Result) MarshalJSON() ([]byte, error) {
	vals := r.Values
	if vals == nil {
		vals = []float64{}
	}
	return json.Marshal(resultJSON{
		Stat: r.Stat, Observed: finite(r.Observed), Mean: finite(r.Mean), SD: finite(r.SD),
		Z: finite(r.Z), P: finite(r.P), PUpper: finite(r.PUpper), PLower: finite(r.PLower),
		PTwo: finite(r.PTwo), PHolm: finite(r.PHolm), Side: r.Side, Alpha: r.Alpha,
		Significant: r.Significant, Method: r.Method, Count: r.Count, Failed: r.Failed,
		Values: vals, Error: r.Error, Warnings: r.Warnings,
	})
}

// UnmarshalJSON reads what MarshalJSON writes, null numbers as NaN.
func (r *Result) UnmarshalJSON(b []byte) error {
	var j resultJSON
	if err := json.Unmarshal(b, &j); err != nil {
		return err
	}
	*r = Result{
		Stat: j.Stat, Observed: orNaN(j.Observed), Mean: orNaN(j.Mean), SD: orNaN(j.SD),
		Z: orNaN(j.Z), P: orNaN(j.P), PUpper: orNaN(j.PUpper), PLower: orNaN(j.PLower),
		PTwo: orNaN(j.PTwo), PHolm: orNaN(j.PHolm), Side: j.Side, Alpha: j.Alpha,
		Significant: j.Significant, Method: j.Method, Count: j.Count, Failed: j.Failed,
		Values: j.Values, Error: j.Error, Warnings: j.Warnings,
	}
	return nil
}
