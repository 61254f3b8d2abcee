// Package columnar writes the tool's tables as Parquet files
// (github.com/parquet-go/parquet-go), column for column and value for
// value what their CSV form holds, so that notebooks load a campaign's
// tables without parsing text.
//
// A table is converted from the CSV its writer produces: the header gives
// the columns in order, a Kinds function their types. Numbers are read
// back from the CSV text exactly (the writers print the shortest text that
// reads back to the same float64), so the Parquet values are the values
// the CSV stands for, bit for bit; an empty numeric or boolean field is a
// null. String columns are required; everything else is optional.
package columnar

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"reflect"
	"slices"
	"strconv"
	"strings"

	"github.com/parquet-go/parquet-go"
)

// Kind is the type of a column.
type Kind int

// Column kinds and their Parquet types.
const (
	// String is a required UTF-8 string (BYTE_ARRAY, logical type STRING).
	String Kind = iota
	// Int64 is an optional signed 64-bit integer (INT64).
	Int64
	// Uint64 is an optional unsigned 64-bit integer (INT64, logical type
	// INT(64, unsigned)).
	Uint64
	// Float64 is an optional IEEE double (DOUBLE).
	Float64
	// Bool is an optional boolean (BOOLEAN); CSV "true" and "false".
	Bool
)

// Kinds returns the kind of the column named name, and false when the
// table has no such column (then FromCSV fails rather than guess).
type Kinds func(name string) (Kind, bool)

// ErrNoKind is returned for a CSV column the Kinds function does not know.
var ErrNoKind = errors.New("column without a declared type")

// FromCSV reads the CSV table from r (header first) and writes it to w as
// one Parquet file whose columns are the header's, in order, typed by
// kinds. A field that does not parse as its column's kind is an error
// naming the row and column.
func FromCSV(w io.Writer, r io.Reader, kinds Kinds) error {
	cr := csv.NewReader(r)
	cr.ReuseRecord = true
	header, err := cr.Read()
	if err == io.EOF {
		return errors.New("parquet: empty table (no header)")
	}
	if err != nil {
		return fmt.Errorf("parquet: %w", err)
	}
	header = slices.Clone(header) // the reader reuses its record
	cols := make([]Kind, len(header))
	fields := make([]reflect.StructField, len(header))
	for i, name := range header {
		k, ok := kinds(name)
		if !ok {
			return fmt.Errorf("parquet: %w: %q", ErrNoKind, name)
		}
		if strings.ContainsAny(name, ",") {
			return fmt.Errorf("parquet: column name %q holds a comma", name)
		}
		cols[i] = k
		tag := name
		var typ reflect.Type
		switch k {
		case String:
			typ = reflect.TypeFor[string]()
		case Int64:
			typ, tag = reflect.TypeFor[int64](), name+",optional"
		case Uint64:
			typ, tag = reflect.TypeFor[uint64](), name+",optional"
		case Float64:
			typ, tag = reflect.TypeFor[float64](), name+",optional"
		case Bool:
			typ, tag = reflect.TypeFor[bool](), name+",optional"
		default:
			return fmt.Errorf("parquet: column %q: unknown kind %d", name, k)
		}
		fields[i] = reflect.StructField{Name: fmt.Sprintf("F%d", i), Type: typ, Tag: reflect.StructTag(`parquet:"` + tag + `"`)}
	}
	// A struct type keeps the columns in the header's order (a
	// parquet.Group would sort them by name).
	schema := parquet.SchemaOf(reflect.New(reflect.StructOf(fields)).Interface())
	pw := parquet.NewWriter(w, schema, parquet.Compression(&parquet.Zstd))
	row := make(parquet.Row, len(header))
	for line := 2; ; line++ {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return fmt.Errorf("parquet: %w", err)
		}
		for i, s := range rec {
			v, err := value(cols[i], s)
			if err != nil {
				return fmt.Errorf("parquet: row %d, column %q: %w", line, header[i], err)
			}
			switch {
			case cols[i] == String:
				row[i] = v.Level(0, 0, i)
			case v.IsNull():
				row[i] = v.Level(0, 0, i)
			default:
				row[i] = v.Level(0, 1, i)
			}
		}
		if _, err := pw.WriteRows([]parquet.Row{row}); err != nil {
			return fmt.Errorf("parquet: %w", err)
		}
	}
	if err := pw.Close(); err != nil {
		return fmt.Errorf("parquet: %w", err)
	}
	return nil
}

// value parses one CSV field as kind k; "" is null for every kind but
// String.
func value(k Kind, s string) (parquet.Value, error) {
	if s == "" && k != String {
		return parquet.NullValue(), nil
	}
	switch k {
	case String:
		return parquet.ByteArrayValue([]byte(s)), nil
	case Int64:
		v, err := strconv.ParseInt(s, 10, 64)
		return parquet.Int64Value(v), err
	case Uint64:
		v, err := strconv.ParseUint(s, 10, 64)
		return parquet.Int64Value(int64(v)), err
	case Float64:
		v, err := strconv.ParseFloat(s, 64)
		return parquet.DoubleValue(v), err
	}
	v, err := strconv.ParseBool(s)
	return parquet.BooleanValue(v), err
}
