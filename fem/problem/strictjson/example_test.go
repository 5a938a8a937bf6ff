package strictjson_test

import (
	"fmt"

	"gapcert/fem/problem/strictjson"
)

// A document that encoding/json alone would accept, reading the later
// "Upper" as the upper end, is refused with the path of the key.
func ExampleDecode() {
	type bound struct {
		Lower string `json:"lower"`
		Upper string `json:"upper"`
	}
	var b struct {
		Gap bound `json:"gap"`
	}
	err := strictjson.Decode([]byte(`{"gap": {"lower": "1", "upper": "2", "Upper": "9"}}`), &b)
	fmt.Println(err)
	err = strictjson.Decode([]byte(`{"gap": {"lower": "1", "upper": "2"}, "gap": {"lower": "0", "upper": "9"}}`), &b)
	fmt.Println(err)
	err = strictjson.Decode([]byte(`{"gap": {"lower": "1", "upper": "2"}}`), &b)
	fmt.Println(b.Gap, err)
	// Output:
	// gap.Upper: unknown key "Upper": keys are case-sensitive, the key here is "upper"
	// gap: duplicate key "gap"
	// {1 2} <nil>
}
