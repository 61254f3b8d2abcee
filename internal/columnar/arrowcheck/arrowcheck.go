// Package arrowcheck reads a Parquet file with an independent
// implementation, Apache Arrow's Go Parquet reader
// (github.com/apache/arrow-go/v18 v18.9.0, pqarrow), and compares it with
// the CSV table it was made from, value for value. It is imported by
// tests only, so the tool's binary does not carry Arrow.
package arrowcheck

import (
	"bytes"
	"context"
	"encoding/csv"
	"fmt"
	"math"
	"strconv"

	"github.com/apache/arrow-go/v18/arrow"
	"github.com/apache/arrow-go/v18/arrow/array"
	"github.com/apache/arrow-go/v18/arrow/memory"
	"github.com/apache/arrow-go/v18/parquet/file"
	"github.com/apache/arrow-go/v18/parquet/pqarrow"
)

// Compare reads parquetData with Arrow and checks that it holds exactly
// the table csvData holds: the same column names in the same order, one
// row per CSV row, and in every cell the same value (floats bit for bit,
// an empty CSV field as a null unless the column is a string). It
// returns the number of cells compared.
func Compare(csvData, parquetData []byte) (int, error) {
	rows, err := csv.NewReader(bytes.NewReader(csvData)).ReadAll()
	if err != nil {
		return 0, fmt.Errorf("csv: %w", err)
	}
	if len(rows) == 0 {
		return 0, fmt.Errorf("csv: no header")
	}
	header, rows := rows[0], rows[1:]
	rdr, err := file.NewParquetReader(bytes.NewReader(parquetData))
	if err != nil {
		return 0, fmt.Errorf("arrow: %w", err)
	}
	defer rdr.Close()
	fr, err := pqarrow.NewFileReader(rdr, pqarrow.ArrowReadProperties{}, memory.DefaultAllocator)
	if err != nil {
		return 0, fmt.Errorf("arrow: %w", err)
	}
	tbl, err := fr.ReadTable(context.Background())
	if err != nil {
		return 0, fmt.Errorf("arrow: %w", err)
	}
	defer tbl.Release()
	if int(tbl.NumCols()) != len(header) {
		return 0, fmt.Errorf("%d columns, the CSV has %d", tbl.NumCols(), len(header))
	}
	if int(tbl.NumRows()) != len(rows) {
		return 0, fmt.Errorf("%d rows, the CSV has %d", tbl.NumRows(), len(rows))
	}
	cells := 0
	for c, name := range header {
		if got := tbl.Schema().Field(c).Name; got != name {
			return cells, fmt.Errorf("column %d is %q, the CSV's is %q", c+1, got, name)
		}
		r := 0
		for _, chunk := range tbl.Column(c).Data().Chunks() {
			for j := 0; j < chunk.Len(); j, r = j+1, r+1 {
				if err := same(chunk, j, rows[r][c]); err != nil {
					return cells, fmt.Errorf("row %d, column %q: %w", r+2, name, err)
				}
				cells++
			}
		}
	}
	return cells, nil
}

// same compares cell j of a with the CSV field s.
func same(a arrow.Array, j int, s string) error {
	if a.IsNull(j) {
		if s != "" {
			return fmt.Errorf("null, the CSV has %q", s)
		}
		return nil
	}
	var got, want string
	switch v := a.(type) {
	case *array.String:
		got, want = v.Value(j), s
	case *array.Float64:
		w, err := strconv.ParseFloat(s, 64)
		if err != nil {
			return fmt.Errorf("%v, the CSV has %q", v.Value(j), s)
		}
		if math.Float64bits(v.Value(j)) != math.Float64bits(w) {
			return fmt.Errorf("%v (bits %#x), the CSV has %q", v.Value(j), math.Float64bits(v.Value(j)), s)
		}
		return nil
	case *array.Int64:
		got, want = strconv.FormatInt(v.Value(j), 10), s
	case *array.Uint64:
		got, want = strconv.FormatUint(v.Value(j), 10), s
	case *array.Boolean:
		got, want = strconv.FormatBool(v.Value(j)), s
	default:
		return fmt.Errorf("unexpected Arrow type %s", a.DataType())
	}
	if got != want {
		return fmt.Errorf("%q, the CSV has %q", got, want)
	}
	return nil
}
