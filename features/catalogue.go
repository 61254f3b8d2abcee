package features

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"strings"
)

// SchemaVersion numbers the layout of the feature vector. It changes when the
// meaning of a feature changes without its name changing; a changed name
// list changes SchemaHash on its own. Version 2: quantised traces are
// dithered within their converter step before measuring (DetectGrid), the
// Lyapunov estimator chooses its scaling region anew, and sc_psd_lines
// joined the catalogue. Version 3: every identifier follows the project's
// own scheme, family prefix + quantity + parameter (hv_, nv_ visibility
// graphs; nl_ nonlinear; sc_ scaling; op_ ordinal patterns; dx_
// increments); values and order are unchanged (README, "Changes").
const SchemaVersion = 3

// Family groups features by the kind of estimator behind them.
type Family string

// The feature families, in catalogue order.
const (
	FamilyGraph      Family = "graph"
	FamilyNonlinear  Family = "nonlinear"
	FamilyScaling    Family = "scaling"
	FamilyOrdinal    Family = "ordinal"
	FamilyIncrements Family = "increments"
	// Extended families (outside the schema; see IsExtended).
	FamilyRecurrenceNet Family = "recurrence network"
	FamilyOrdinalNet    Family = "ordinal network"
)

// Entry describes one feature of the vector.
type Entry struct {
	Name        string `json:"name"`
	Family      Family `json:"family"`
	Description string `json:"description"`
	Reference   string `json:"reference"`
}

// Catalogue returns the entries of the feature vector in order: the
// schema the classifier reads. The extended families (Extended) are not in
// it.
func Catalogue() []Entry {
	var out []Entry
	for _, f := range families {
		out = append(out, f.entries...)
	}
	return out
}

// Names returns the ordered feature names.
func Names() []string {
	cat := Catalogue()
	names := make([]string, len(cat))
	for i, e := range cat {
		names[i] = e.Name
	}
	return names
}

// Lookup returns the catalogue entry of a feature, of the schema or of an
// extended family (IsExtended tells which).
func Lookup(name string) (Entry, bool) {
	for _, e := range append(Catalogue(), Extended()...) {
		if e.Name == name {
			return e, true
		}
	}
	return Entry{}, false
}

// SchemaHash identifies the feature vector layout: the first 16 hex digits
// of the SHA-256 of the schema version and the ordered names. A model file
// records it; a model whose hash differs from the running catalogue's was
// trained on another vector and is refused.
func SchemaHash() string {
	h := sha256.New()
	fmt.Fprintf(h, "tracesift features v%d\n", SchemaVersion)
	h.Write([]byte(strings.Join(Names(), "\n")))
	return hex.EncodeToString(h.Sum(nil))[:16]
}

// missingByNature lists the features that are absent by nature for whole
// classes of traces: noise has no credible exponential divergence and no
// correlation scaling region. Their absence is information (nl_div_ok
// carries it), not a failure worth a warning.
var missingByNature = map[string]bool{"nl_div_rate": true, "nl_div_rate_tau": true, "nl_gp_dim": true}

// MissingByNature reports whether a feature may be missing for a trace
// without anything having gone wrong.
func MissingByNature(name string) bool { return missingByNature[name] }
