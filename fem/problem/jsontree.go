package problem

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strconv"
)

// node is a JSON value as read from a problem file, with object keys kept
// in file order so that duplicates and unknown keys can be reported.
type node struct {
	kind  nodeKind
	str   string      // kindString
	num   json.Number // kindNumber: the literal text, never converted to float
	keys  []string    // kindObject, in file order
	vals  []*node     // kindObject values (parallel to keys) or kindArray elements
	index map[string]int
}

type nodeKind int

const (
	kindNull nodeKind = iota
	kindBool
	kindNumber
	kindString
	kindArray
	kindObject
)

func (k nodeKind) String() string {
	return [...]string{"null", "a boolean", "a number", "a string", "a list", "an object"}[k]
}

// maxDepth bounds the nesting of a problem file; the layout needs 4.
const maxDepth = 32

// get returns the value under key of an object node, or nil.
func (n *node) get(key string) *node {
	if i, ok := n.index[key]; ok {
		return n.vals[i]
	}
	return nil
}

// readTree decodes one JSON value from data. Numbers keep their literal
// text (json.Decoder.UseNumber). Duplicate keys are reported as issues with
// their path; syntax errors are returned as an error with line and column.
func readTree(data []byte, iss *issues) (*node, error) {
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.UseNumber()
	root, err := readValue(dec, "", 0, iss)
	if err != nil {
		return nil, positioned(data, dec, err)
	}
	if _, err := dec.Token(); err != io.EOF {
		off := dec.InputOffset()
		line, col := lineCol(data, off)
		return nil, fmt.Errorf("invalid JSON at line %d, column %d: data after the top-level object", line, col)
	}
	return root, nil
}

func readValue(dec *json.Decoder, path string, depth int, iss *issues) (*node, error) {
	if depth > maxDepth {
		return nil, errors.New("nesting too deep")
	}
	tok, err := dec.Token()
	if err != nil {
		if err == io.EOF {
			return nil, io.ErrUnexpectedEOF
		}
		return nil, err
	}
	switch t := tok.(type) {
	case nil:
		return &node{kind: kindNull}, nil
	case bool: // only its kind matters: no key takes a boolean
		return &node{kind: kindBool}, nil
	case json.Number:
		return &node{kind: kindNumber, num: t}, nil
	case string:
		return &node{kind: kindString, str: t}, nil
	case json.Delim:
		switch t {
		case '[':
			n := &node{kind: kindArray}
			for dec.More() {
				v, err := readValue(dec, path+"["+strconv.Itoa(len(n.vals))+"]", depth+1, iss)
				if err != nil {
					return nil, err
				}
				n.vals = append(n.vals, v)
			}
			if _, err := dec.Token(); err != nil {
				return nil, err
			}
			return n, nil
		case '{':
			n := &node{kind: kindObject, index: map[string]int{}}
			for dec.More() {
				kt, err := dec.Token()
				if err != nil {
					return nil, err
				}
				key := kt.(string) // the decoder only yields string keys inside objects
				v, err := readValue(dec, join(path, key), depth+1, iss)
				if err != nil {
					return nil, err
				}
				if _, dup := n.index[key]; dup {
					iss.add(join(path, key), "duplicate key", "give each key once")
					continue
				}
				n.index[key] = len(n.keys)
				n.keys = append(n.keys, key)
				n.vals = append(n.vals, v)
			}
			if _, err := dec.Token(); err != nil {
				return nil, err
			}
			return n, nil
		}
	}
	return nil, fmt.Errorf("unexpected token %v", tok)
}

// join appends an object key to a JSON path.
func join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

// positioned turns a decoding error into one that names line and column.
func positioned(data []byte, dec *json.Decoder, err error) error {
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
	return fmt.Errorf("invalid JSON at line %d, column %d: %s", line, col, msg)
}

// lineCol converts a byte offset into a 1-based line and byte column.
func lineCol(data []byte, off int64) (line, col int) {
	if off > int64(len(data)) {
		off = int64(len(data))
	}
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
