package jsonsafe

import (
	"encoding/json"
	"fmt"
	"reflect"
	"slices"
	"strconv"
	"strings"
)

// Options control Marshal. The zero value writes compact JSON with nil
// slices and maps as null, as encoding/json does.
type Options struct {
	// Indent is one level of indentation (for example two spaces). Empty
	// means compact output without any whitespace. When set, every struct
	// field and map entry goes on its own line as `"name": value`, and so
	// does every element of an array or slice whose elements are structs,
	// slices, maps or pointers; arrays of other elements (numbers, strings,
	// booleans, fixed-size arrays, interfaces) stay on one line as
	// [1, 2, 3]. Empty arrays, structs and maps are written as [] and {}.
	// The output has no trailing newline.
	Indent string
	// NilAsEmpty writes a nil slice as [] and a nil map as {} instead of
	// null.
	NilAsEmpty bool
}

// Marshal encodes v as JSON in the manner of encoding/json — exported
// struct fields in declaration order, named by their json tag or else by
// the Go field name, "-" skipping a field, "omitempty" dropping false, 0,
// nil pointers and interfaces and empty strings, slices, maps and arrays
// (never a struct) — except that NaN and ±Inf floats are written as null
// and finite floats in the form Float uses. Strings and names are escaped
// exactly as encoding/json escapes them.
//
// Unlike encoding/json, Marshal encodes by kind only: it does not call
// MarshalJSON or MarshalText methods (so a type may call Marshal on itself
// from its own MarshalJSON), does not flatten embedded structs (they are a
// field named after their type), ignores tag options other than omitempty,
// writes []byte as an array of numbers rather than base64 and float32
// values through their float64 value. Maps must have string-kind keys and
// are written in sorted key order. Complex numbers, channels, functions,
// uintptr and unsafe pointers are errors. v must not contain a pointer
// cycle.
func Marshal(v any, opts Options) ([]byte, error) {
	e := encoder{opts: opts}
	if err := e.value(reflect.ValueOf(v), 0); err != nil {
		return nil, err
	}
	return e.buf, nil
}

// encoder accumulates the output of one Marshal call.
type encoder struct {
	buf  []byte
	opts Options
}

func (e *encoder) value(v reflect.Value, depth int) error {
	switch v.Kind() {
	case reflect.Invalid:
		e.buf = append(e.buf, "null"...)
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			e.buf = append(e.buf, "null"...)
			return nil
		}
		return e.value(v.Elem(), depth)
	case reflect.Float32, reflect.Float64:
		e.buf = appendFloat(e.buf, v.Float())
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		e.buf = strconv.AppendInt(e.buf, v.Int(), 10)
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		e.buf = strconv.AppendUint(e.buf, v.Uint(), 10)
	case reflect.Bool:
		e.buf = strconv.AppendBool(e.buf, v.Bool())
	case reflect.String:
		return e.quote(v.String())
	case reflect.Slice:
		if v.IsNil() {
			e.buf = append(e.buf, e.nilText("[]")...)
			return nil
		}
		return e.array(v, depth)
	case reflect.Array:
		return e.array(v, depth)
	case reflect.Map:
		return e.mapping(v, depth)
	case reflect.Struct:
		return e.object(v, depth)
	default:
		return fmt.Errorf("jsonsafe: unsupported kind %s", v.Kind())
	}
	return nil
}

// nilText is what a nil slice or map becomes: empty, or null.
func (e *encoder) nilText(empty string) string {
	if e.opts.NilAsEmpty {
		return empty
	}
	return "null"
}

// quote appends s as a JSON string, escaped as encoding/json escapes it.
func (e *encoder) quote(s string) error {
	b, err := json.Marshal(s)
	if err != nil {
		return err
	}
	e.buf = append(e.buf, b...)
	return nil
}

// newline starts a new line at the given depth; nothing in compact mode.
func (e *encoder) newline(depth int) {
	if e.opts.Indent == "" {
		return
	}
	e.buf = append(e.buf, '\n')
	for range depth {
		e.buf = append(e.buf, e.opts.Indent...)
	}
}

// key appends the name of an object member and its separator; in indented
// mode on its own line one level below depth.
func (e *encoder) key(name string, depth int) error {
	e.newline(depth + 1)
	if err := e.quote(name); err != nil {
		return err
	}
	if e.opts.Indent == "" {
		e.buf = append(e.buf, ':')
	} else {
		e.buf = append(e.buf, ": "...)
	}
	return nil
}

func (e *encoder) array(v reflect.Value, depth int) error {
	n := v.Len()
	if n == 0 {
		e.buf = append(e.buf, "[]"...)
		return nil
	}
	// In indented mode numbers, strings and other flat values share one
	// line; structures go one per line.
	split := false
	if e.opts.Indent != "" {
		switch v.Type().Elem().Kind() {
		case reflect.Struct, reflect.Slice, reflect.Map, reflect.Pointer:
			split = true
		}
	}
	e.buf = append(e.buf, '[')
	for i := range n {
		if i > 0 {
			e.buf = append(e.buf, ',')
			if e.opts.Indent != "" && !split {
				e.buf = append(e.buf, ' ')
			}
		}
		if split {
			e.newline(depth + 1)
		}
		if err := e.value(v.Index(i), depth+1); err != nil {
			return err
		}
	}
	if split {
		e.newline(depth)
	}
	e.buf = append(e.buf, ']')
	return nil
}

func (e *encoder) mapping(v reflect.Value, depth int) error {
	kt := v.Type().Key()
	if kt.Kind() != reflect.String {
		return fmt.Errorf("jsonsafe: unsupported map key type %s", kt)
	}
	if v.IsNil() {
		e.buf = append(e.buf, e.nilText("{}")...)
		return nil
	}
	keys := make([]string, 0, v.Len())
	for _, k := range v.MapKeys() {
		keys = append(keys, k.String())
	}
	slices.Sort(keys)
	e.buf = append(e.buf, '{')
	for i, k := range keys {
		if i > 0 {
			e.buf = append(e.buf, ',')
		}
		if err := e.key(k, depth); err != nil {
			return err
		}
		if err := e.value(v.MapIndex(reflect.ValueOf(k).Convert(kt)), depth+1); err != nil {
			return fmt.Errorf("key %q: %w", k, err)
		}
	}
	if len(keys) > 0 {
		e.newline(depth)
	}
	e.buf = append(e.buf, '}')
	return nil
}

func (e *encoder) object(v reflect.Value, depth int) error {
	t := v.Type()
	e.buf = append(e.buf, '{')
	first := true
	for i := range t.NumField() {
		sf := t.Field(i)
		if !sf.IsExported() {
			continue
		}
		name, tagOpts, _ := strings.Cut(sf.Tag.Get("json"), ",")
		if name == "-" {
			continue
		}
		if name == "" {
			name = sf.Name
		}
		fv := v.Field(i)
		if strings.Contains(tagOpts, "omitempty") && isEmpty(fv) {
			continue
		}
		if !first {
			e.buf = append(e.buf, ',')
		}
		first = false
		if err := e.key(name, depth); err != nil {
			return err
		}
		if err := e.value(fv, depth+1); err != nil {
			return fmt.Errorf("field %s: %w", sf.Name, err)
		}
	}
	if !first {
		e.newline(depth)
	}
	e.buf = append(e.buf, '}')
	return nil
}

// isEmpty is encoding/json's notion of empty for omitempty: length zero for
// arrays, maps, slices and strings, never for structs, the zero value for
// everything else.
func isEmpty(v reflect.Value) bool {
	switch v.Kind() {
	case reflect.Array, reflect.Map, reflect.Slice, reflect.String:
		return v.Len() == 0
	case reflect.Struct:
		return false
	}
	return v.IsZero()
}
