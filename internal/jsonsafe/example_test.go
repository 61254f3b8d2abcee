package jsonsafe_test

import (
	"encoding/json"
	"fmt"
	"math"

	"github.com/tracesift/tracesift/internal/jsonsafe"
)

func ExampleFloat() {
	row := struct {
		Name  string         `json:"name"`
		Value jsonsafe.Float `json:"value"`
		Slope jsonsafe.Float `json:"slope"`
	}{"lambda", 0.4054651081081644, jsonsafe.Float(math.NaN())}
	b, _ := json.Marshal(row)
	fmt.Println(string(b))

	var back struct{ Slope jsonsafe.Float }
	_ = json.Unmarshal([]byte(`{"Slope":null}`), &back)
	fmt.Println(math.IsNaN(float64(back.Slope)))
	// Output:
	// {"name":"lambda","value":0.4054651081081644,"slope":null}
	// true
}

func ExampleMarshal() {
	type fit struct {
		Slope  float64   `json:"slope"`
		R2     float64   `json:"r2"`
		Points []float64 `json:"points"`
		Note   string    `json:"note,omitempty"`
	}
	f := fit{Slope: math.Inf(1), R2: 0.5}

	b, _ := jsonsafe.Marshal(f, jsonsafe.Options{})
	fmt.Println(string(b))

	b, _ = jsonsafe.Marshal(f, jsonsafe.Options{Indent: "  ", NilAsEmpty: true})
	fmt.Println(string(b))
	// Output:
	// {"slope":null,"r2":0.5,"points":null}
	// {
	//   "slope": null,
	//   "r2": 0.5,
	//   "points": []
	// }
}
