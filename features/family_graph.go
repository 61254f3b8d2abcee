package features

var graphFamily = family{
	name:    FamilyGraph,
	entries: []Entry{},
	compute: func([]float64, Options, *sink) {},
}
