// Package models ships the default classifier model inside the binary.
//
// default.model is made by one command from the repository root:
//
//	go run ./cmd/tracesift train --reference --seed 1 -o models/default.model
//
// It trains on the reference set (every system of the generators package
// with randomised parameters, observed coordinates, lengths and measurement
// chains; see classifier.ReferencePlan), stores the leave-one-family-out
// validation and the novelty index in the file, and reproduces the
// committed file byte for byte. A test fails when the embedded model's feature schema differs from
// the running feature catalogue, so a stale model cannot ship: after any
// change to the features, run the command again and commit the new file.
package models

import _ "embed"

//go:embed default.model
var defaultModel []byte

// DefaultName is how messages refer to the embedded model.
const DefaultName = "embedded default model"

// DefaultCommand is the command that makes default.model.
const DefaultCommand = "go run ./cmd/tracesift train --reference --seed 1 -o models/default.model"

// Default returns the bytes of the embedded default model file.
func Default() []byte { return defaultModel }
