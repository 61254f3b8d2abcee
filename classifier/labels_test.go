package classifier

import (
	"errors"
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
