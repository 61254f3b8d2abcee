package classifier

import "errors"

// Sentinel errors; callers tell cases apart with errors.Is.
var (
	// ErrConfig reports an invalid Config field.
	ErrConfig = errors.New("invalid classifier configuration")
	// ErrDataset reports a malformed training or evaluation data set.
	ErrDataset = errors.New("invalid data set")
	// ErrDimension reports a feature vector whose length differs from the
	// model's feature count.
	ErrDimension = errors.New("feature vector length does not match the model")
	// ErrEmptyModel reports a Model value that was not produced by Train
	// or Read (it holds no trees).
	ErrEmptyModel = errors.New("model holds no trees (not trained or loaded)")
	// ErrGolearn reports a failure inside the golearn learner.
	ErrGolearn = errors.New("golearn tree learner failed")
	// ErrBadMagic reports a file that is not a tracesift model file.
	ErrBadMagic = errors.New("not a tracesift model file (bad magic)")
	// ErrNewerFormat reports a model file written by a newer format version
	// than this build can read.
	ErrNewerFormat = errors.New("model file format is newer than this program supports")
	// ErrCorrupt reports a damaged or truncated model file (checksum or
	// structure check failed).
	ErrCorrupt = errors.New("model file is damaged or truncated")
	// ErrSchemaMismatch reports a model trained on a different feature
	// catalogue than the caller's.
	ErrSchemaMismatch = errors.New("model feature schema does not match")
)
