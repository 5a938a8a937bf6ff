package strictjson

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// MaxDepth bounds the nesting of objects and arrays in a document (a
// certificate with an embedded reference certificate needs about 10).
const MaxDepth = 32

// Kind is the JSON kind of a Value.
type Kind int

// Kinds of JSON values.
const (
	Null Kind = iota
	Bool
	Number
	String
	Array
	Object
)

// String returns the kind as a noun for messages ("a number").
func (k Kind) String() string {
	return [...]string{"null", "a boolean", "a number", "a string", "a list", "an object"}[k]
}

// Value is one JSON value as written.
type Value struct {
	Kind  Kind
	Bool  bool        // Bool
	Num   json.Number // Number: the literal text, never converted
	Str   string      // String
	Keys  []string    // Object: the keys in file order, each once
	Elems []*Value    // Object: the values, parallel to Keys; Array: the elements
	index map[string]int
}

// Get returns the value under key of an object, or nil if v is not an
// object or has no such key. Keys are compared exactly.
func (v *Value) Get(key string) *Value {
	if i, ok := v.index[key]; ok {
		return v.Elems[i]
	}
	return nil
}

// Error is a defect of a JSON document: a syntax error (Line and Column
// set, Path empty), or a key or value that the strict reading refuses
// (Path set: the JSON path of the key or value, "" for the document as a
// whole).
type Error struct {
	Path   string
	Line   int // 1-based; 0 when the error has no position
	Column int // 1-based byte column
	Msg    string
}

func (e *Error) Error() string {
	if e.Line > 0 {
		return fmt.Sprintf("invalid JSON at line %d, column %d: %s", e.Line, e.Column, e.Msg)
	}
	if e.Path == "" {
		return e.Msg
	}
	return e.Path + ": " + e.Msg
}

// Join returns the path of key inside the object at path.
func Join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

// Under returns the path of a value at path (relative, as in an Error)
// inside the value at prefix.
func Under(prefix, path string) string {
	if path == "" || prefix == "" || strings.HasPrefix(path, "[") {
		return prefix + path
	}
	return prefix + "." + path
}

// Index returns the path of element i of the array at path.
func Index(path string, i int) string {
	return path + "[" + strconv.Itoa(i) + "]"
}

// Parse reads one JSON value from data. Syntax errors, nesting deeper than
// MaxDepth and data after the value end the reading and are returned as
// err, an *Error with line and column. A key repeated in an object does
// not end it: the first occurrence is kept in the tree and each repeat is
// listed in dups (an *Error with the path of the repeated key), so that a
// reader that reports every defect can report them all; a document with
// dups is not strictly valid.
func Parse(data []byte) (root *Value, dups []*Error, err error) {
	p := parser{dec: json.NewDecoder(bytes.NewReader(data))}
	p.dec.UseNumber()
	root, err = p.value("", 0)
	if err != nil {
		return nil, nil, positioned(data, p.dec, err)
	}
	end := p.dec.InputOffset()
	if _, err := p.dec.Token(); err != io.EOF {
		for end < int64(len(data)) && strings.ContainsRune(" \t\r\n", rune(data[end])) {
			end++
		}
		line, col := lineCol(data, end)
		return nil, nil, &Error{Line: line, Column: col, Msg: "data after the top-level value"}
	}
	return root, p.dups, nil
}

type parser struct {
	dec  *json.Decoder
	dups []*Error
}

var errTooDeep = fmt.Errorf("nesting deeper than %d levels", MaxDepth)

func (p *parser) value(path string, depth int) (*Value, error) {
	if depth > MaxDepth {
		return nil, errTooDeep
	}
	tok, err := p.dec.Token()
	if err != nil {
		if err == io.EOF {
			return nil, io.ErrUnexpectedEOF
		}
		return nil, err
	}
	switch t := tok.(type) {
	case nil:
		return &Value{Kind: Null}, nil
	case bool:
		return &Value{Kind: Bool, Bool: t}, nil
	case json.Number:
		return &Value{Kind: Number, Num: t}, nil
	case string:
		return &Value{Kind: String, Str: t}, nil
	case json.Delim:
		switch t {
		case '[':
			v := &Value{Kind: Array}
			for p.dec.More() {
				e, err := p.value(Index(path, len(v.Elems)), depth+1)
				if err != nil {
					return nil, err
				}
				v.Elems = append(v.Elems, e)
			}
			_, err := p.dec.Token() // ']'
			return v, err
		case '{':
			v := &Value{Kind: Object, index: map[string]int{}}
			for p.dec.More() {
				kt, err := p.dec.Token()
				if err != nil {
					return nil, err
				}
				key := kt.(string) // the decoder yields only string keys inside objects
				e, err := p.value(Join(path, key), depth+1)
				if err != nil {
					return nil, err
				}
				if _, dup := v.index[key]; dup {
					p.dups = append(p.dups, &Error{Path: Join(path, key), Msg: fmt.Sprintf("duplicate key %q", key)})
					continue
				}
				v.index[key] = len(v.Keys)
				v.Keys = append(v.Keys, key)
				v.Elems = append(v.Elems, e)
			}
			_, err := p.dec.Token() // '}'
			return v, err
		}
	}
	return nil, fmt.Errorf("unexpected token %v", tok)
}

// positioned turns a decoding error into an *Error with line and column.
func positioned(data []byte, dec *json.Decoder, err error) *Error {
	off := dec.InputOffset()
	msg := err.Error()
	var se *json.SyntaxError
	if errors.As(err, &se) {
		off = se.Offset
		if off > 0 {
			off-- // Offset counts the offending byte
		}
	}
	if errors.Is(err, io.ErrUnexpectedEOF) {
		msg = "unexpected end of file"
		off = int64(len(data))
	}
	line, col := lineCol(data, off)
	return &Error{Line: line, Column: col, Msg: msg}
}

// lineCol converts a byte offset into a 1-based line and byte column.
func lineCol(data []byte, off int64) (line, col int) {
	off = min(max(off, 0), int64(len(data)))
	line, col = 1, 1
	for _, c := range data[:off] {
		if c == '\n' {
			line++
			col = 1
		} else {
			col++
		}
	}
	return line, col
}
