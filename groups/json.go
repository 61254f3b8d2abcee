package groups

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"reflect"
	"sort"
	"strconv"
	"strings"
)

// WriteJSON writes r as one indented JSON document: every field of Result
// (groups with their summaries, pairs with all tests and effect sizes,
// curves, pooled distributions, the input samples, settings, notes) with
// the json names given in the type definitions. Numbers keep full
// precision (shortest representation that round-trips); NaN and ±Inf,
// which JSON cannot hold, are written as null.
func WriteJSON(w io.Writer, r Result) error {
	var buf bytes.Buffer
	if err := encodeJSON(&buf, reflect.ValueOf(r), ""); err != nil {
		return fmt.Errorf("json: %w", err)
	}
	buf.WriteByte('\n')
	if _, err := w.Write(buf.Bytes()); err != nil {
		return fmt.Errorf("json: %w", err)
	}
	return nil
}

// encodeJSON writes v like encoding/json with indentation, except that
// non-finite floats become null. It handles the kinds Result uses.
func encodeJSON(buf *bytes.Buffer, v reflect.Value, indent string) error {
	const step = "  "
	switch v.Kind() {
	case reflect.Invalid:
		buf.WriteString("null")
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			buf.WriteString("null")
			return nil
		}
		return encodeJSON(buf, v.Elem(), indent)
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
			buf.WriteString("[]")
			return nil
		}
		if v.Len() == 0 {
			buf.WriteString("[]")
			return nil
		}
		// Numbers and strings on one line, structures one per line.
		ek := v.Type().Elem().Kind()
		flat := ek != reflect.Struct && ek != reflect.Slice && ek != reflect.Map && ek != reflect.Pointer
		buf.WriteByte('[')
		for i := 0; i < v.Len(); i++ {
			if i > 0 {
				buf.WriteByte(',')
				if flat {
					buf.WriteByte(' ')
				}
			}
			if !flat {
				buf.WriteString("\n" + indent + step)
			}
			if err := encodeJSON(buf, v.Index(i), indent+step); err != nil {
				return err
			}
		}
		if !flat {
			buf.WriteString("\n" + indent)
		}
		buf.WriteByte(']')
	case reflect.Map:
		if v.Type().Key().Kind() != reflect.String {
			return fmt.Errorf("unsupported map key %s", v.Type().Key())
		}
		keys := make([]string, 0, v.Len())
		for _, k := range v.MapKeys() {
			keys = append(keys, k.String())
		}
		sort.Strings(keys)
		buf.WriteByte('{')
		for i, k := range keys {
			if i > 0 {
				buf.WriteByte(',')
			}
			kb, _ := json.Marshal(k)
			buf.WriteString("\n" + indent + step)
			buf.Write(kb)
			buf.WriteString(": ")
			if err := encodeJSON(buf, v.MapIndex(reflect.ValueOf(k).Convert(v.Type().Key())), indent+step); err != nil {
				return err
			}
		}
		if len(keys) > 0 {
			buf.WriteString("\n" + indent)
		}
		buf.WriteByte('}')
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
			if strings.Contains(opts, "omitempty") && fv.IsZero() {
				continue
			}
			if fv.Kind() == reflect.Slice && strings.Contains(opts, "omitempty") && fv.Len() == 0 {
				continue
			}
			if !first {
				buf.WriteByte(',')
			}
			first = false
			kb, _ := json.Marshal(name)
			buf.WriteString("\n" + indent + step)
			buf.Write(kb)
			buf.WriteString(": ")
			if err := encodeJSON(buf, fv, indent+step); err != nil {
				return err
			}
		}
		if !first {
			buf.WriteString("\n" + indent)
		}
		buf.WriteByte('}')
	default:
		return fmt.Errorf("unsupported kind %s", v.Kind())
	}
	return nil
}
