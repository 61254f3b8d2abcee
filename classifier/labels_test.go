package classifier

import (
	"bytes"
	"encoding/binary"
	"errors"
	"math"
	"strings"
	"testing"
)

func TestReadLabels(t *testing.T) {
	in := "# campaign\nfile,class\nfresh/a.csv,stochastic\n\"odd, name.csv\",Chaotic\n\nb.csv , regular\n"
	got, err := ReadLabels(strings.NewReader(in), "labels.csv")
	if err != nil {
		t.Fatal(err)
	}
	want := []Label{{"fresh/a.csv", "stochastic", 3}, {"odd, name.csv", "chaotic", 4}, {"b.csv", "regular", 6}}
	if len(got) != len(want) {
		t.Fatalf("got %v", got)
	}
	for i := range want {
		if got[i] != want[i] {
			t.Errorf("row %d: %+v, want %+v", i, got[i], want[i])
		}
	}
}

func TestReadLabelsErrors(t *testing.T) {
	cases := []struct{ in, want string }{
		{"", "labels.csv: labels: empty file"},
		{"file,class\n", "labels.csv: labels: header but no labelled traces"},
		{"path;class\na;chaotic\n", `labels.csv line 1: labels: want the header "file,class"`},
		{"file,class\na.csv,chaotic,extra\n", "labels.csv line 2: labels: want 2 fields"},
		{"file,class\na.csv,turbulent\n", `labels.csv line 2: labels: unknown class "turbulent"; valid classes: chaotic, regular, stochastic`},
		{"file,class\na.csv,undetermined\n", `labels.csv line 2: labels: unknown class "undetermined"`},
		{"file,class\na.csv,chaotic\n\na.csv,regular\n", "labels.csv line 4: labels: a.csv already labelled on line 2"},
		{"file,class\n,chaotic\n", "labels.csv line 2: labels: empty file name"},
	}
	for _, c := range cases {
		_, err := ReadLabels(strings.NewReader(c.in), "labels.csv")
		if err == nil || !errors.Is(err, ErrLabels) || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("%q: error %v, want prefix %q", c.in, err, c.want)
		}
	}
}

// TestReadLabelsMessages: whole messages, for inputs whose echo must stay
// short (binary files, long lines).
func TestReadLabelsMessages(t *testing.T) {
	// Raw float64 samples, as a trace given by mistake for the labels.
	var raw []byte
	for i := range 200 {
		raw = binary.LittleEndian.AppendUint64(raw, math.Float64bits(1+float64(i)/7))
	}
	noNUL := bytes.Repeat([]byte{0xc3, 0x28, 0x01, 0x9a, 0x41, 0x3f, 0xbe, 0x07}, 200)
	const binaryMsg = `labels.csv: labels: looks binary (not delimited text); want CSV text with the header "file,class"`
	cases := []struct{ name, in, want string }{
		{"raw samples", string(raw), binaryMsg},
		{"binary without NUL bytes", string(noNUL), binaryMsg},
		{"NUL after a header", "file,class\n\x00\x00a.csv,chaotic\n", binaryMsg},
		{"long header", strings.Repeat("Spalte;", 40) + "\n",
			`labels.csv line 1: labels: want the header "file,class", got "` + strings.Repeat("Spalte;", 8) + `Sp"…`},
		{"long class", "file,class\na.csv," + strings.Repeat("é", 100) + "\n",
			`labels.csv line 2: labels: unknown class "` + strings.Repeat("é", 58) + `"…; valid classes: chaotic, regular, stochastic`},
		{"long duplicate path", "file,class\n" + strings.Repeat("d/", 50) + "a.csv,chaotic\n" + strings.Repeat("d/", 50) + "a.csv,regular\n",
			"labels.csv line 3: labels: " + strings.Repeat("d/", 29) + "d… already labelled on line 2"},
		{"duplicate path with a control character", "file,class\na\rb.csv,chaotic\na\rb.csv,regular\n",
			`labels.csv line 3: labels: "a\rb.csv" already labelled on line 2`},
	}
	for _, c := range cases {
		_, err := ReadLabels(strings.NewReader(c.in), "labels.csv")
		if !errors.Is(err, ErrLabels) || err.Error() != c.want {
			t.Errorf("%s: error\n got %v\nwant %s", c.name, err, c.want)
		}
	}
	// Text in a legacy 8-bit encoding is not binary: "café" in ISO 8859-1.
	got, err := ReadLabels(strings.NewReader("file,class\ncaf\xe9.csv,chaotic\nb.csv,regular\n"), "labels.csv")
	if err != nil || len(got) != 2 || got[0].Path != "caf\xe9.csv" {
		t.Fatalf("Latin-1 labels: %v, %v", got, err)
	}
}

// FuzzReadLabels: ReadLabels never panics, and every error wraps ErrLabels
// in one line of bounded length, whatever the file holds.
func FuzzReadLabels(f *testing.F) {
	for _, s := range []string{
		"file,class\na.csv,chaotic\n",
		"# c\npath , CLASS\n\"a,b.csv\",Regular\n\nb.csv,stochastic\n",
		"file,class\na.csv,chaotic\na.csv,regular\n",
		"file;class\n",
		"file,class\n\x00\x01\x02\x03\n",
		"\xff\xfe f\x00i\x00l\x00e\x00",
		strings.Repeat("x", 300) + "\n",
		"file,class\na\rb,chaotic\na\rb,chaotic\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		labels, err := ReadLabels(bytes.NewReader(data), "labels.csv")
		if err != nil {
			msg := err.Error()
			if !errors.Is(err, ErrLabels) || strings.ContainsAny(msg, "\n\r") || len(msg) > 400 {
				t.Fatalf("error %q", msg)
			}
			return
		}
		for _, l := range labels {
			if l.Path == "" || !isClass(l.Class) {
				t.Fatalf("accepted %+v", l)
			}
		}
	})
}
