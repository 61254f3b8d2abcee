package jsonsafe

import (
	"encoding/json"
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

func TestFloatMarshal(t *testing.T) {
	// Expected texts: JSON has no NaN or infinity (RFC 8259 §6), hence
	// null; finite values follow strconv.FormatFloat(f, 'g', -1, 64)
	// (shortest round-trip digits, exponent form for decimal exponent
	// < −4 or ≥ 6, two-digit exponent), per the strconv documentation.
	tests := []struct {
		in   float64
		want string
	}{
		{math.NaN(), "null"},
		{math.Inf(1), "null"},
		{math.Inf(-1), "null"},
		{0, "0"},
		{math.Copysign(0, -1), "-0"},
		{1, "1"},
		{-0.25, "-0.25"},
		{0.1, "0.1"},
		{1.0 / 3, "0.3333333333333333"},
		{123456, "123456"},
		{1e6, "1e+06"},
		{1234567, "1.234567e+06"},
		{1e-4, "0.0001"},
		{1e-5, "1e-05"},
		{1e21, "1e+21"},
		{math.MaxFloat64, "1.7976931348623157e+308"},
		{math.SmallestNonzeroFloat64, "5e-324"},
	}
	for _, tc := range tests {
		b, err := Float(tc.in).MarshalJSON()
		if err != nil {
			t.Fatalf("%v: %v", tc.in, err)
		}
		if string(b) != tc.want {
			t.Errorf("Float(%v).MarshalJSON() = %s, want %s", tc.in, b, tc.want)
		}
		// Through encoding/json, as a field and inside a slice, the bytes
		// must not change (encoding/json only compacts Marshaler output).
		doc, err := json.Marshal(struct {
			V  Float   `json:"v"`
			Vs []Float `json:"vs"`
		}{Float(tc.in), []Float{Float(tc.in)}})
		if err != nil {
			t.Fatalf("%v: encoding/json: %v", tc.in, err)
		}
		if want := `{"v":` + tc.want + `,"vs":[` + tc.want + `]}`; string(doc) != want {
			t.Errorf("encoding/json of Float(%v) = %s, want %s", tc.in, doc, want)
		}
	}
}

func TestFloatUnmarshal(t *testing.T) {
	// null reads as NaN (the inverse of MarshalJSON); numbers as
	// strconv.ParseFloat reads them; anything else is an error.
	tests := []struct {
		in      string
		want    float64
		wantErr bool
	}{
		{"null", math.NaN(), false},
		{"0", 0, false},
		{"-0", math.Copysign(0, -1), false},
		{"1.5", 1.5, false},
		{"1e-05", 1e-5, false},
		{"1e-5", 1e-5, false},
		{"-2.5E+3", -2500, false},
		{"1.7976931348623157e+308", math.MaxFloat64, false},
		{`"1"`, 0, true},
		{"true", 0, true},
		{"", 0, true},
		{"1e999", 0, true}, // out of range: strconv.ErrRange
	}
	for _, tc := range tests {
		var f Float
		err := f.UnmarshalJSON([]byte(tc.in))
		if tc.wantErr {
			if err == nil {
				t.Errorf("UnmarshalJSON(%q) = %v, want an error", tc.in, f)
			}
			continue
		}
		if err != nil {
			t.Errorf("UnmarshalJSON(%q): %v", tc.in, err)
			continue
		}
		if math.Float64bits(float64(f)) != math.Float64bits(tc.want) && !(math.IsNaN(tc.want) && math.IsNaN(float64(f))) {
			t.Errorf("UnmarshalJSON(%q) = %v, want %v", tc.in, f, tc.want)
		}
	}
}

func TestFloatRoundTrip(t *testing.T) {
	// Shortest 'g' digits parse back to the identical float64 (strconv
	// documentation: precision −1 is the minimal number of digits
	// necessary to represent the value uniquely); NaN and ±Inf come back
	// as NaN by design.
	rng := rand.New(rand.NewPCG(1, 2))
	in := []Float{Float(math.NaN()), Float(math.Inf(1)), Float(math.Inf(-1)), 0, Float(math.Copysign(0, -1))}
	for range 2000 {
		// Random bit patterns cover every exponent; skip non-finite ones.
		v := math.Float64frombits(rng.Uint64())
		if math.IsNaN(v) || math.IsInf(v, 0) {
			continue
		}
		in = append(in, Float(v))
	}
	b, err := json.Marshal(in)
	if err != nil {
		t.Fatal(err)
	}
	var back []Float
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if len(back) != len(in) {
		t.Fatalf("read %d values, wrote %d", len(back), len(in))
	}
	for i := range in {
		want := float64(in[i])
		if math.IsInf(want, 0) {
			want = math.NaN()
		}
		got := float64(back[i])
		if math.IsNaN(want) != math.IsNaN(got) || !math.IsNaN(want) && math.Float64bits(want) != math.Float64bits(got) {
			t.Errorf("value %d: wrote %v, read %v", i, in[i], back[i])
		}
	}
}

func FuzzFloatUnmarshal(f *testing.F) {
	for _, s := range []string{"null", "0", "-0", "1.5", "1e-05", "1e+21", `"x"`, "", "NaN", "Inf", "0x1p-2"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		var v Float
		if err := v.UnmarshalJSON([]byte(s)); err != nil {
			return
		}
		// Whatever was accepted must write out and read back to itself
		// (NaN and ±Inf, which ParseFloat also accepts, as NaN).
		b, err := v.MarshalJSON()
		if err != nil {
			t.Fatalf("%q: MarshalJSON: %v", s, err)
		}
		var w Float
		if err := w.UnmarshalJSON(b); err != nil {
			t.Fatalf("%q: wrote %s, which does not read back: %v", s, b, err)
		}
		x, y := float64(v), float64(w)
		if math.IsNaN(x) || math.IsInf(x, 0) {
			if !math.IsNaN(y) {
				t.Fatalf("%q: non-finite %v came back as %v", s, x, y)
			}
			return
		}
		if math.Float64bits(x) != math.Float64bits(y) {
			t.Fatalf("%q: %v came back as %v (%s)", s, x, y, strconv.Quote(string(b)))
		}
	})
}
