package jsonsafe

import (
	"bytes"
	"encoding/json"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"
)

type inner struct {
	A float64 `json:"a"`
	B []int   `json:"b"`
}

type outer struct {
	Name   string  `json:"name"`
	X      float64 `json:"x"`
	N      int64   `json:"n"`
	U      uint16  `json:"u"`
	OK     bool    `json:"ok"`
	Plain  int
	Skip   int `json:"-"`
	hidden int
	In     inner     `json:"in"`
	P      *inner    `json:"p"`
	Xs     []float64 `json:"xs"`
	Ins    []inner   `json:"ins"`
}

type omit struct {
	Zero   inner              `json:"zero,omitempty"`   // a struct is never empty
	Arr0   [0]int             `json:"arr0,omitempty"`   // length 0: empty
	Arr2   [2]int             `json:"arr2,omitempty"`   // zeros, but length 2: kept
	Map    map[string]int     `json:"map,omitempty"`    // empty non-nil map: empty
	Ptr    *inner             `json:"ptr,omitempty"`    // nil: empty
	Iface  any                `json:"iface,omitempty"`  // nil: empty
	Int    int                `json:"int,omitempty"`    // 0: empty
	Bool   bool               `json:"bool,omitempty"`   // false: empty
	Str    string             `json:"str,omitempty"`    // "": empty
	Slice  []int              `json:"slice,omitempty"`  // empty non-nil: empty
	Nil    []int              `json:"nil,omitempty"`    // nil: empty
	NaN    float64            `json:"nan,omitempty"`    // NaN ≠ 0: kept, as null
	NegZ   float64            `json:"negz,omitempty"`   // −0 == 0: empty
	NilMap map[string]float64 `json:"nilmap,omitempty"` // nil: empty
}

type keyName string

type selfMarshal int

// MarshalJSON must not be called by Marshal, which encodes by kind.
func (selfMarshal) MarshalJSON() ([]byte, error) { return []byte(`"custom"`), nil }

type Embedded struct {
	E int `json:"e"`
}

type withEmbedded struct {
	Embedded
	F int `json:"f"`
}

func TestMarshal(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	indent := Options{Indent: "  "}
	grouped := Options{Indent: "  ", NilAsEmpty: true}
	full := outer{
		Name: "x", X: nan, N: -3, U: 7, OK: true, Plain: 4, Skip: 9, hidden: 1,
		In:  inner{A: 1.5, B: []int{1, 2}},
		P:   &inner{A: -inf},
		Xs:  []float64{1, inf, -0.5},
		Ins: []inner{{A: 2, B: []int{}}, {A: nan}},
	}
	// Expected texts: compact ones are what encoding/json writes for the
	// same value with NaN/±Inf replaced by null (encoding/json
	// documentation: field order, names, omitempty, sorted map keys);
	// indented ones follow the layout documented on Options.Indent, the
	// layout groups.WriteJSON has always written.
	tests := []struct {
		name string
		v    any
		opts Options
		want string
	}{
		{"nil", nil, Options{}, `null`},
		{"NaN", nan, Options{}, `null`},
		{"+Inf", inf, Options{}, `null`},
		{"-Inf", -inf, Options{}, `null`},
		{"float", 0.1, Options{}, `0.1`},
		{"big float", 1234567.0, Options{}, `1.234567e+06`},
		{"float32 through float64", float32(0.1), Options{}, `0.10000000149011612`},
		{"int", int8(-5), Options{}, `-5`},
		{"uint", uint64(math.MaxUint64), Options{}, `18446744073709551615`},
		{"bool", false, Options{}, `false`},
		{"escaped string", "<a&b>\"\n\u2028", Options{}, `"\u003ca\u0026b\u003e\"\n\u2028"`},
		{"bytes as numbers", []byte{1, 2}, Options{}, `[1,2]`},
		{"nil pointer", (*inner)(nil), Options{}, `null`},
		{"pointer", &inner{A: 1}, Options{}, `{"a":1,"b":null}`},
		{"interface holding struct", []any{inner{}, 2.5, "s", nil}, Options{}, `[{"a":0,"b":null},2.5,"s",null]`},
		{"nil slice", []int(nil), Options{}, `null`},
		{"nil slice as empty", []int(nil), Options{NilAsEmpty: true}, `[]`},
		{"empty slice", []int{}, Options{}, `[]`},
		{"empty array", [0]int{}, Options{}, `[]`},
		{"nil vs empty in struct", inner{}, Options{}, `{"a":0,"b":null}`},
		{"nil as empty in struct", inner{}, Options{NilAsEmpty: true}, `{"a":0,"b":[]}`},
		{"empty in struct", inner{B: []int{}}, Options{}, `{"a":0,"b":[]}`},
		{"nil map", map[string]int(nil), Options{}, `null`},
		{"nil map as empty", map[string]int(nil), Options{NilAsEmpty: true}, `{}`},
		{"empty map", map[string]int{}, Options{}, `{}`},
		{"map sorted", map[string]float64{"b": 1, "a": nan, "c": -2, "B": inf}, Options{}, `{"B":null,"a":null,"b":1,"c":-2}`},
		{"named key type", map[keyName]int{"z": 1, "y": 2}, Options{}, `{"y":2,"z":1}`},
		{"map of slices", map[string][]float64{"k": {nan, 1}}, Options{}, `{"k":[null,1]}`},
		{"nested", full, Options{}, `{"name":"x","x":null,"n":-3,"u":7,"ok":true,"Plain":4,` +
			`"in":{"a":1.5,"b":[1,2]},"p":{"a":null,"b":null},"xs":[1,null,-0.5],` +
			`"ins":[{"a":2,"b":[]},{"a":null,"b":null}]}`},
		{"omitempty", omit{NaN: nan}, Options{}, `{"zero":{"a":0,"b":null},"arr2":[0,0],"nan":null}`},
		{"omitempty kept", omit{Map: map[string]int{"a": 1}, Int: 1, Str: "s", Slice: []int{3}, Ptr: &inner{}},
			Options{}, `{"zero":{"a":0,"b":null},"arr2":[0,0],"map":{"a":1},"ptr":{"a":0,"b":null},"int":1,"str":"s","slice":[3]}`},
		{"omitempty all empty", struct {
			A []int `json:"a,omitempty"`
		}{}, indent, `{}`},
		{"empty struct", struct{}{}, indent, `{}`},
		{"marshaler ignored", []selfMarshal{3}, Options{}, `[3]`},
		{"embedded not flattened", withEmbedded{Embedded{1}, 2}, Options{}, `{"Embedded":{"e":1},"f":2}`},

		{"indent scalars inline", []float64{1, nan, 3}, indent, `[1, null, 3]`},
		{"indent arrays inline", [][2]float64{{1, 2}, {3, inf}}, indent, `[[1, 2], [3, null]]`},
		{"indent slices split", [][]float64{{1, 2}, {}}, indent, "[\n  [1, 2],\n  []\n]"},
		{"indent map", map[string]float64{"b": 1, "a": nan}, indent, "{\n  \"a\": null,\n  \"b\": 1\n}"},
		{"indent nil map", map[string]int(nil), indent, `null`},
		{"grouped nil map", map[string]int(nil), grouped, `{}`},
		{"indent nil slice", inner{A: 1}, indent, "{\n  \"a\": 1,\n  \"b\": null\n}"},
		{"grouped nil slice", inner{A: 1}, grouped, "{\n  \"a\": 1,\n  \"b\": []\n}"},
		{"indent nested", full, grouped, `{
  "name": "x",
  "x": null,
  "n": -3,
  "u": 7,
  "ok": true,
  "Plain": 4,
  "in": {
    "a": 1.5,
    "b": [1, 2]
  },
  "p": {
    "a": null,
    "b": []
  },
  "xs": [1, null, -0.5],
  "ins": [
    {
      "a": 2,
      "b": []
    },
    {
      "a": null,
      "b": []
    }
  ]
}`},
		{"indent pointers split", []*inner{nil, {A: 1}}, Options{Indent: "\t"}, "[\n\tnull,\n\t{\n\t\t\"a\": 1,\n\t\t\"b\": null\n\t}\n]"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := Marshal(tc.v, tc.opts)
			if err != nil {
				t.Fatal(err)
			}
			if string(got) != tc.want {
				t.Errorf("got\n%s\nwant\n%s", got, tc.want)
			}
			if !json.Valid(got) {
				t.Errorf("invalid JSON: %s", got)
			}
		})
	}
}

func TestMarshalErrors(t *testing.T) {
	// Kinds with no JSON form (encoding/json also refuses complex, chan
	// and func) and maps whose keys are not strings are errors, naming
	// the field on the way.
	tests := []struct {
		name string
		v    any
		want string
	}{
		{"complex", complex(1, 2), "unsupported kind complex128"},
		{"chan", make(chan int), "unsupported kind chan"},
		{"func", func() {}, "unsupported kind func"},
		{"uintptr", uintptr(1), "unsupported kind uintptr"},
		{"int keys", map[int]string{1: "a"}, "unsupported map key type int"},
		{"nil map int keys", map[int]string(nil), "unsupported map key type int"},
		{"field", struct{ C complex64 }{}, "field C: jsonsafe: unsupported kind complex64"},
		{"nested field", struct{ In struct{ F func() } }{}, "field In: field F: jsonsafe: unsupported kind func"},
		{"map value", map[string]any{"k": make(chan int)}, `key "k": jsonsafe: unsupported kind chan`},
	}
	for _, tc := range tests {
		for _, opts := range []Options{{}, {Indent: "  ", NilAsEmpty: true}} {
			b, err := Marshal(tc.v, opts)
			if err == nil {
				t.Errorf("%s: got %s, want an error", tc.name, b)
				continue
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("%s: error %q, want it to contain %q", tc.name, err, tc.want)
			}
		}
	}
}

// mirror holds every kind Marshal supports whose encoding/json form is the
// same apart from float formatting.
type mirror struct {
	F      float64 `json:"f"`
	G      float64 `json:"g,omitempty"`
	I      int     `json:"i"`
	I32    int32   `json:"i32,omitempty"`
	U      uint32  `json:"u"`
	B      bool    `json:"b,omitempty"`
	S      string  `json:"s"`
	Plain  string
	P      *mirrorLeaf        `json:"p"`
	Q      *mirrorLeaf        `json:"q,omitempty"`
	Leaf   mirrorLeaf         `json:"leaf"`
	Leaves []mirrorLeaf       `json:"leaves"`
	Fs     []float64          `json:"fs"`
	Opt    []float64          `json:"opt,omitempty"`
	Arr    [3]float64         `json:"arr"`
	M      map[string]float64 `json:"m"`
	MS     map[keyName][]int  `json:"ms,omitempty"`
	Any    any                `json:"any"`
	Skip   float64            `json:"-"`
}

type mirrorLeaf struct {
	X float64 `json:"x"`
	N []int   `json:"n"`
	T string  `json:"t,omitempty"`
}

// randomMirror fills a mirror from rng; float values come from fl.
func randomMirror(rng *rand.Rand, fl func() float64) mirror {
	str := func() string {
		// ASCII, HTML-special, control, non-ASCII and invalid UTF-8 bytes.
		alphabet := []string{"a", "Z", "0", " ", "<", ">", "&", `"`, `\`, "\n", "\x01", "é", "€", "\u2028", "\xff", "𝄞"}
		var sb strings.Builder
		for range rng.IntN(6) {
			sb.WriteString(alphabet[rng.IntN(len(alphabet))])
		}
		return sb.String()
	}
	ints := func() []int {
		switch rng.IntN(3) {
		case 0:
			return nil
		case 1:
			return []int{}
		}
		v := make([]int, 1+rng.IntN(4))
		for i := range v {
			v[i] = rng.IntN(2000) - 1000
		}
		return v
	}
	leaf := func() mirrorLeaf { return mirrorLeaf{X: fl(), N: ints(), T: str()} }
	m := mirror{
		F: fl(), I: rng.IntN(1<<20) - 1<<19, U: rng.Uint32(), B: rng.IntN(2) == 0,
		S: str(), Plain: str(), Leaf: leaf(), Arr: [3]float64{fl(), fl(), fl()},
	}
	if rng.IntN(2) == 0 {
		m.G = fl()
	}
	if rng.IntN(2) == 0 {
		m.I32 = rng.Int32()
	}
	if rng.IntN(2) == 0 {
		l := leaf()
		m.P = &l
	}
	if rng.IntN(2) == 0 {
		l := leaf()
		m.Q = &l
	}
	if k := rng.IntN(4); k > 0 {
		m.Leaves = make([]mirrorLeaf, k-1)
		for i := range m.Leaves {
			m.Leaves[i] = leaf()
		}
	}
	if k := rng.IntN(5); k > 0 {
		m.Fs = make([]float64, k-1)
		for i := range m.Fs {
			m.Fs[i] = fl()
		}
	}
	if rng.IntN(2) == 0 {
		m.Opt = []float64{fl()}
	}
	if k := rng.IntN(5); k > 0 {
		m.M = map[string]float64{}
		for range k - 1 {
			m.M[str()] = fl()
		}
	}
	if rng.IntN(2) == 0 {
		m.MS = map[keyName][]int{keyName(str()): ints(), keyName(str()): ints()}
	}
	switch rng.IntN(4) {
	case 1:
		m.Any = fl()
	case 2:
		m.Any = str()
	case 3:
		m.Any = leaf()
	}
	return m
}

func TestMarshalMatchesEncodingJSON(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	// Floats in [1e-4, 1e6) and 0: there strconv 'g' (shortest) and
	// encoding/json both use plain decimal notation with the same shortest
	// digits (strconv: exponent form only below 1e-4 or from 1e6;
	// encoding/json: only below 1e-6 or from 1e21), so the bytes must be
	// identical.
	plain := func() float64 {
		if rng.IntN(8) == 0 {
			return 0
		}
		v := math.Pow(10, -4+10*rng.Float64())
		if v >= 1e6 {
			v = 999999.5
		}
		if rng.IntN(2) == 0 {
			v = -v
		}
		return v
	}
	// Any finite float64 (random bit patterns cover every exponent): the
	// texts may differ (1e-05 against 0.00001) but must decode to the same
	// values.
	anyFinite := func() float64 {
		for {
			if v := math.Float64frombits(rng.Uint64()); !math.IsNaN(v) && !math.IsInf(v, 0) {
				return v
			}
		}
	}
	for i := range 500 {
		m := randomMirror(rng, plain)
		want, err := json.Marshal(m)
		if err != nil {
			t.Fatal(err)
		}
		got, err := Marshal(m, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got, want) {
			t.Fatalf("case %d:\nMarshal       %s\nencoding/json %s", i, got, want)
		}
		// Indentation only adds whitespace between tokens.
		ind, err := Marshal(m, Options{Indent: "  "})
		if err != nil {
			t.Fatal(err)
		}
		var compact bytes.Buffer
		if err := json.Compact(&compact, ind); err != nil {
			t.Fatalf("case %d: indented output is not JSON: %v\n%s", i, err, ind)
		}
		if !bytes.Equal(compact.Bytes(), want) {
			t.Fatalf("case %d: indented output compacts to\n%s\nwant\n%s", i, compact.Bytes(), want)
		}
	}
	for i := range 500 {
		m := randomMirror(rng, anyFinite)
		want, err := json.Marshal(m)
		if err != nil {
			t.Fatal(err)
		}
		for _, opts := range []Options{{}, {Indent: "  "}} {
			got, err := Marshal(m, opts)
			if err != nil {
				t.Fatal(err)
			}
			var a, b any
			if err := json.Unmarshal(got, &a); err != nil {
				t.Fatalf("case %d: Marshal output does not decode: %v\n%s", i, err, got)
			}
			if err := json.Unmarshal(want, &b); err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(a, b) {
				t.Fatalf("case %d (%+v): decodes differently\nMarshal       %s\nencoding/json %s", i, opts, got, want)
			}
		}
	}
}

func TestMarshalSelfFromMarshalJSON(t *testing.T) {
	// A type may call Marshal on itself from its MarshalJSON (the pattern
	// of the visibility result types): Marshal does not call MarshalJSON,
	// so there is no recursion, and encoding/json embeds the result.
	got, err := json.Marshal(struct {
		R selfResult `json:"r"`
	}{selfResult{V: math.NaN(), W: 2}})
	if err != nil {
		t.Fatal(err)
	}
	if want := `{"r":{"v":null,"w":2}}`; string(got) != want {
		t.Errorf("got %s, want %s", got, want)
	}
}

type selfResult struct {
	V float64 `json:"v"`
	W float64 `json:"w"`
}

func (r selfResult) MarshalJSON() ([]byte, error) { return Marshal(r, Options{}) }
