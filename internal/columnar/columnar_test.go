package columnar_test

import (
	"bytes"
	"errors"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/internal/columnar"
	"github.com/tracesift/tracesift/internal/columnar/arrowcheck"
)

// edgeTable holds the values a CSV table of the tool can carry, with the
// edge cases of each kind: the extremes of float64 (largest, smallest
// normal and subnormal, negative zero, infinities, 0.1 which has no exact
// binary form), of int64 and uint64, empty fields (nulls), and strings
// with commas, quotes, line breaks and non-ASCII characters.
const edgeTable = `file,samples,seed,value,flag
"a,b.csv",300,18446744073709551615,1.7976931348623157e+308,true
"say ""hi"".npy",-9223372036854775808,0,4.9406564584124654e-324,false
"µA
trace",0,1,-0,
ü.tdms,,,+Inf,true
x.wav,1,2,-Inf,false
y,2,3,0.1,true
z,3,4,,false
`

func edgeKinds(name string) (columnar.Kind, bool) {
	k, ok := map[string]columnar.Kind{"file": columnar.String, "samples": columnar.Int64, "seed": columnar.Uint64,
		"value": columnar.Float64, "flag": columnar.Bool}[name]
	return k, ok
}

// TestRoundTripArrow writes the edge table as Parquet and reads it back
// with Apache Arrow's Go Parquet reader (arrow-go v18.9.0, an independent
// implementation): every cell must come back as the CSV states it, floats
// bit for bit (arrowcheck.Compare).
func TestRoundTripArrow(t *testing.T) {
	var out bytes.Buffer
	if err := columnar.FromCSV(&out, strings.NewReader(edgeTable), edgeKinds); err != nil {
		t.Fatal(err)
	}
	n, err := arrowcheck.Compare([]byte(edgeTable), out.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	if n != 7*5 {
		t.Fatalf("%d cells compared, want 35", n)
	}
	// Same input, same bytes.
	var again bytes.Buffer
	if err := columnar.FromCSV(&again, strings.NewReader(edgeTable), edgeKinds); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(out.Bytes(), again.Bytes()) {
		t.Error("two conversions of one table differ")
	}
}

// A header-only table gives a file with the columns and no rows.
func TestEmptyTable(t *testing.T) {
	const table = "file,samples,seed,value,flag\n"
	var out bytes.Buffer
	if err := columnar.FromCSV(&out, strings.NewReader(table), edgeKinds); err != nil {
		t.Fatal(err)
	}
	if n, err := arrowcheck.Compare([]byte(table), out.Bytes()); err != nil || n != 0 {
		t.Fatalf("%d cells, %v", n, err)
	}
}

// The comparison itself must notice a difference in one value.
func TestCompareNotices(t *testing.T) {
	var out bytes.Buffer
	if err := columnar.FromCSV(&out, strings.NewReader(edgeTable), edgeKinds); err != nil {
		t.Fatal(err)
	}
	changed := strings.Replace(edgeTable, "0.1,true", "0.10000000000000002,true", 1)
	if _, err := arrowcheck.Compare([]byte(changed), out.Bytes()); err == nil || !strings.Contains(err.Error(), `row 7, column "value"`) {
		t.Fatalf("got %v, want a difference in row 7, column value", err)
	}
}

func TestErrors(t *testing.T) {
	for _, tc := range []struct{ table, want string }{
		{"file,other\nx,1\n", `parquet: column without a declared type: "other"`},
		{"file,samples\nx,1.5\n", `parquet: row 2, column "samples": strconv.ParseInt: parsing "1.5": invalid syntax`},
		{"file,flag\nx,yes\n", `parquet: row 2, column "flag": strconv.ParseBool: parsing "yes": invalid syntax`},
		{"", "parquet: empty table (no header)"},
	} {
		err := columnar.FromCSV(&bytes.Buffer{}, strings.NewReader(tc.table), edgeKinds)
		if err == nil || err.Error() != tc.want {
			t.Errorf("%q: got %v, want %s", tc.table, err, tc.want)
		}
	}
	err := columnar.FromCSV(&bytes.Buffer{}, strings.NewReader("other\n"), edgeKinds)
	if !errors.Is(err, columnar.ErrNoKind) {
		t.Errorf("got %v, want ErrNoKind", err)
	}
}
