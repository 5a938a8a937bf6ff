package strictjson

import (
	"bytes"
	"encoding"
	"encoding/json"
	"fmt"
	"math"
	"reflect"
	"strconv"
	"strings"
	"sync"
)

// Decode reads the JSON document data into the value v points to. The
// document is read by Parse and checked against the type of *v before
// anything is stored: it is refused, with an *Error naming the path, if
//
//   - it has a syntax error, nesting deeper than MaxDepth, or data after
//     the value;
//   - any object, at any depth, repeats a key;
//   - an object decoded into a struct has a key that is not spelled
//     exactly as one of the struct's JSON field names (the json tag's name,
//     else the Go field name; fields tagged "-" and unexported fields have
//     none), case variants of a field name included;
//   - a value does not have the kind its Go type needs: an object for a
//     struct or map, a list for a slice (a list of the right length for an
//     array), a string for a string or an encoding.TextUnmarshaler, a
//     number for a json.Number (kept as written), true or false for a
//     bool, an integer literal in range for an integer type, a number in
//     range for a float type; null is accepted for pointers, slices, maps
//     and interfaces only.
//
// Values of a type with its own UnmarshalJSON (json.RawMessage above all)
// are checked for repeated keys only; whoever decodes them later reads
// them strictly in turn. Interface values receive numbers as json.Number,
// so that no number is rounded. Decode panics if v is not a non-nil
// pointer.
func Decode(data []byte, v any) error {
	rv := reflect.ValueOf(v)
	if rv.Kind() != reflect.Pointer || rv.IsNil() {
		panic("strictjson: Decode needs a non-nil pointer")
	}
	root, dups, err := Parse(data)
	if err != nil {
		return err
	}
	if len(dups) > 0 {
		return dups[0]
	}
	if err := Check(root, rv.Type().Elem()); err != nil {
		return err
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	dec.DisallowUnknownFields()
	if err := dec.Decode(v); err != nil {
		// Check accepts only what encoding/json decodes; reaching this is a
		// defect of Check, reported rather than hidden.
		return &Error{Msg: "strictjson: the checked document does not decode: " + err.Error()}
	}
	return nil
}

// Check reports the first place where the tree v does not fit the Go type
// t as Decode requires (see Decode; repeated keys are Parse's to report).
// Paths are relative to v.
func Check(v *Value, t reflect.Type) error {
	return check(v, t, "")
}

var (
	unmarshalerType     = reflect.TypeFor[json.Unmarshaler]()
	textUnmarshalerType = reflect.TypeFor[encoding.TextUnmarshaler]()
	numberType          = reflect.TypeFor[json.Number]()
)

func check(v *Value, t reflect.Type, path string) error {
	want := func(what string) error {
		return &Error{Path: path, Msg: fmt.Sprintf("want %s, not %s", what, v.Kind)}
	}
	pt := reflect.PointerTo(t)
	if pt.Implements(unmarshalerType) {
		return nil
	}
	if v.Kind == Null {
		switch t.Kind() {
		case reflect.Pointer, reflect.Slice, reflect.Map, reflect.Interface:
			return nil
		}
		return want(noun(t))
	}
	if pt.Implements(textUnmarshalerType) {
		if v.Kind != String {
			return want("a string")
		}
		return nil
	}
	switch t.Kind() {
	case reflect.Pointer:
		return check(v, t.Elem(), path)
	case reflect.Interface:
		return nil
	case reflect.Struct:
		if v.Kind != Object {
			return want("an object")
		}
		fields := fieldsOf(t)
		for i, key := range v.Keys {
			ft, ok := fields.types[key]
			if !ok {
				return unknownKey(Join(path, key), key, fields.names)
			}
			if err := check(v.Elems[i], ft, Join(path, key)); err != nil {
				return err
			}
		}
		return nil
	case reflect.Map:
		if v.Kind != Object {
			return want("an object")
		}
		if t.Key().Kind() != reflect.String {
			panic("strictjson: map keys other than strings are not supported")
		}
		for i, key := range v.Keys {
			if err := check(v.Elems[i], t.Elem(), Join(path, key)); err != nil {
				return err
			}
		}
		return nil
	case reflect.Slice:
		if t.Elem().Kind() == reflect.Uint8 {
			if v.Kind != String {
				return want("a base64 string")
			}
			return nil
		}
		if v.Kind != Array {
			return want("a list")
		}
		return checkElems(v, t.Elem(), path)
	case reflect.Array:
		if v.Kind != Array {
			return want("a list")
		}
		if len(v.Elems) != t.Len() {
			return &Error{Path: path, Msg: fmt.Sprintf("want a list of %d elements, not %d", t.Len(), len(v.Elems))}
		}
		return checkElems(v, t.Elem(), path)
	case reflect.String:
		if t == numberType {
			if v.Kind != Number {
				return want("a number")
			}
			return nil
		}
		if v.Kind != String {
			return want("a string")
		}
		return nil
	case reflect.Bool:
		if v.Kind != Bool {
			return want("true or false")
		}
		return nil
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		if v.Kind != Number {
			return want("an integer")
		}
		if _, err := strconv.ParseInt(string(v.Num), 10, t.Bits()); err != nil {
			return &Error{Path: path, Msg: fmt.Sprintf("%s is not an integer in [%d, %d]", v.Num, -int64(math.MaxInt64>>(64-t.Bits()))-1, int64(math.MaxInt64>>(64-t.Bits())))}
		}
		return nil
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		if v.Kind != Number {
			return want("an integer")
		}
		if _, err := strconv.ParseUint(string(v.Num), 10, t.Bits()); err != nil {
			return &Error{Path: path, Msg: fmt.Sprintf("%s is not an integer in [0, %d]", v.Num, uint64(math.MaxUint64)>>(64-t.Bits()))}
		}
		return nil
	case reflect.Float32, reflect.Float64:
		if v.Kind != Number {
			return want("a number")
		}
		// Only the range is checked here; the value is stored by
		// encoding/json. Exact numbers belong in strings or json.Number.
		if _, err := strconv.ParseFloat(string(v.Num), t.Bits()); err != nil {
			return &Error{Path: path, Msg: fmt.Sprintf("%s is out of range", v.Num)}
		}
		return nil
	}
	panic("strictjson: cannot decode into " + t.String())
}

func checkElems(v *Value, elem reflect.Type, path string) error {
	for i, e := range v.Elems {
		if err := check(e, elem, Index(path, i)); err != nil {
			return err
		}
	}
	return nil
}

// noun names what a value of type t is written as, for messages.
func noun(t reflect.Type) string {
	switch t.Kind() {
	case reflect.Struct:
		return "an object"
	case reflect.Array:
		return "a list"
	case reflect.String:
		return "a string"
	case reflect.Bool:
		return "true or false"
	case reflect.Float32, reflect.Float64:
		return "a number"
	}
	return "an integer"
}

// unknownKey reports a key that is not a field name; a case variant of a
// field name is named as such.
func unknownKey(path, key string, names []string) error {
	for _, n := range names {
		if strings.EqualFold(n, key) {
			return &Error{Path: path, Msg: fmt.Sprintf("unknown key %q: keys are case-sensitive, the key here is %q", key, n)}
		}
	}
	if len(names) == 0 {
		return &Error{Path: path, Msg: fmt.Sprintf("unknown key %q: this object has no keys", key)}
	}
	return &Error{Path: path, Msg: fmt.Sprintf("unknown key %q; the keys here are %s", key, strings.Join(names, ", "))}
}

// structFields are the JSON field names of a struct type and the type of
// each field.
type structFields struct {
	names []string // in declaration order
	types map[string]reflect.Type
}

var fieldCache sync.Map // reflect.Type → *structFields

// fieldsOf returns the JSON field names of the struct type t as
// encoding/json sees them: the tag's name, else the Go name; fields
// tagged "-" and unexported fields are left out; the fields of an
// embedded struct without a tag name are promoted (a name at a shallower
// depth wins).
func fieldsOf(t reflect.Type) *structFields {
	if f, ok := fieldCache.Load(t); ok {
		return f.(*structFields)
	}
	f := &structFields{types: map[string]reflect.Type{}}
	var walk func(t reflect.Type, depth int, depths map[string]int)
	walk = func(t reflect.Type, depth int, depths map[string]int) {
		var embedded []reflect.Type
		for i := 0; i < t.NumField(); i++ {
			sf := t.Field(i)
			tag := sf.Tag.Get("json")
			if tag == "-" {
				continue
			}
			name, _, _ := strings.Cut(tag, ",")
			if sf.Anonymous && name == "" {
				et := sf.Type
				if et.Kind() == reflect.Pointer {
					et = et.Elem()
				}
				if et.Kind() == reflect.Struct {
					embedded = append(embedded, et)
					continue
				}
			}
			if !sf.IsExported() {
				continue
			}
			if name == "" {
				name = sf.Name
			}
			if d, seen := depths[name]; seen && d <= depth {
				continue
			}
			if _, seen := depths[name]; !seen {
				f.names = append(f.names, name)
			}
			depths[name] = depth
			f.types[name] = sf.Type
		}
		for _, et := range embedded {
			walk(et, depth+1, depths)
		}
	}
	walk(t, 0, map[string]int{})
	fieldCache.Store(t, f)
	return f
}
