package problem

import (
	"encoding/json"

	"gapcert/fem/problem/strictjson"
)

// node is a JSON value as read from a problem file, with object keys kept
// in file order so that unknown keys can be reported where they stand.
type node struct {
	kind  nodeKind
	str   string      // kindString
	num   json.Number // kindNumber: the literal text, never converted to float
	keys  []string    // kindObject, in file order
	vals  []*node     // kindObject values (parallel to keys) or kindArray elements
	index map[string]int
}

type nodeKind = strictjson.Kind

const (
	kindNull   = strictjson.Null
	kindBool   = strictjson.Bool
	kindNumber = strictjson.Number
	kindString = strictjson.String
	kindArray  = strictjson.Array
	kindObject = strictjson.Object
)

// get returns the value under key of an object node, or nil.
func (n *node) get(key string) *node {
	if i, ok := n.index[key]; ok {
		return n.vals[i]
	}
	return nil
}

// readTree reads one JSON value from data with the strict reader of
// package strictjson (numbers keep their literal text, nesting is bounded,
// nothing may follow the value). Every repeated key is reported as an issue
// with its path; syntax errors are returned as an error with line and
// column.
func readTree(data []byte, iss *issues) (*node, error) {
	root, dups, err := strictjson.Parse(data)
	if err != nil {
		return nil, err
	}
	for _, d := range dups {
		iss.add(d.Path, "duplicate key", "give each key once")
	}
	return fromValue(root), nil
}

// fromValue converts the strict reader's tree into the problem reader's.
func fromValue(v *strictjson.Value) *node {
	n := &node{kind: v.Kind, str: v.Str, num: v.Num, keys: v.Keys}
	if v.Kind == kindObject {
		n.index = make(map[string]int, len(v.Keys))
		for i, k := range v.Keys {
			n.index[k] = i
		}
	}
	for _, e := range v.Elems {
		n.vals = append(n.vals, fromValue(e))
	}
	return n
}

// join appends an object key to a JSON path.
func join(path, key string) string { return strictjson.Join(path, key) }
