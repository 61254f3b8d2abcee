package visibility

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"reflect"
	"strconv"
	"strings"
)

// marshalNaNSafe encodes v as encoding/json would (exported fields, json
// tags, omitempty, field order kept), except that NaN and ±Inf floats, which
// encoding/json rejects, are written as null. The result types of this
// package use it in their MarshalJSON methods so that an undefined metric
// never breaks a JSON Lines stream.
func marshalNaNSafe(v any) ([]byte, error) {
	var buf bytes.Buffer
	if err := encodeValue(&buf, reflect.ValueOf(v)); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

func encodeValue(buf *bytes.Buffer, v reflect.Value) error {
	switch v.Kind() {
	case reflect.Invalid:
		buf.WriteString("null")
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			buf.WriteString("null")
			return nil
		}
		return encodeValue(buf, v.Elem())
	case reflect.Float32, reflect.Float64:
		f := v.Float()
		if math.IsNaN(f) || math.IsInf(f, 0) {
			buf.WriteString("null")
			return nil
		}
		buf.Write(strconv.AppendFloat(nil, f, 'g', -1, 64))
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		buf.Write(strconv.AppendInt(nil, v.Int(), 10))
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		buf.Write(strconv.AppendUint(nil, v.Uint(), 10))
	case reflect.Bool:
		buf.WriteString(strconv.FormatBool(v.Bool()))
	case reflect.String:
		b, err := json.Marshal(v.String())
		if err != nil {
			return err
		}
		buf.Write(b)
	case reflect.Slice, reflect.Array:
		if v.Kind() == reflect.Slice && v.IsNil() {
			buf.WriteString("null")
			return nil
		}
		buf.WriteByte('[')
		for i := 0; i < v.Len(); i++ {
			if i > 0 {
				buf.WriteByte(',')
			}
			if err := encodeValue(buf, v.Index(i)); err != nil {
				return err
			}
		}
		buf.WriteByte(']')
	case reflect.Struct:
		t := v.Type()
		buf.WriteByte('{')
		first := true
		for i := 0; i < t.NumField(); i++ {
			sf := t.Field(i)
			if !sf.IsExported() {
				continue
			}
			name, opts, _ := strings.Cut(sf.Tag.Get("json"), ",")
			if name == "-" {
				continue
			}
			if name == "" {
				name = sf.Name
			}
			fv := v.Field(i)
			if strings.Contains(opts, "omitempty") && isEmptyJSON(fv) {
				continue
			}
			if !first {
				buf.WriteByte(',')
			}
			first = false
			b, _ := json.Marshal(name)
			buf.Write(b)
			buf.WriteByte(':')
			if err := encodeValue(buf, fv); err != nil {
				return fmt.Errorf("field %s: %w", sf.Name, err)
			}
		}
		buf.WriteByte('}')
	default:
		return fmt.Errorf("visibility json: unsupported kind %v", v.Kind())
	}
	return nil
}

// isEmptyJSON is encoding/json's notion of empty for omitempty.
func isEmptyJSON(v reflect.Value) bool {
	switch v.Kind() {
	case reflect.Array, reflect.Map, reflect.Slice, reflect.String:
		return v.Len() == 0
	case reflect.Struct:
		return false
	}
	return v.IsZero()
}
