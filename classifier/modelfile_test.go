package classifier

import (
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/json"
	"errors"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"strings"
	"testing"

	"github.com/tracesift/tracesift/features"
)

func smallModel(t testing.TB) (*Model, Dataset) {
	t.Helper()
	ds := noisy(200, 5, 3, 21)
	ds.Description = "unit-test data"
	m, err := Train(ds, Config{Trees: 15, Seed: 4, Schema: Schema{Version: 3, Hash: "abc123"}})
	if err != nil {
		t.Fatal(err)
	}
	return m, ds
}

// TestRoundTrip: Write → Read gives the same predictions (every field of
// every Prediction) and re-writing gives the same bytes.
func TestRoundTrip(t *testing.T) {
	m, ds := smallModel(t)
	cv, err := CrossValidate(ds, 3, Config{Trees: 5, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	m.CV = &cv.CVSummary
	b1 := modelBytes(t, m)
	m2, err := Read(bytes.NewReader(b1))
	if err != nil {
		t.Fatal(err)
	}
	if b2 := modelBytes(t, m2); !bytes.Equal(b1, b2) {
		t.Fatal("re-written model differs")
	}
	if !reflect.DeepEqual(m.trees, m2.trees) {
		t.Fatal("trees differ after the round trip")
	}
	if !reflect.DeepEqual(m.CV, m2.CV) || !reflect.DeepEqual(m.Training, m2.Training) || m.Config != m2.Config {
		t.Fatal("header fields differ after the round trip")
	}
	for _, x := range probePoints(ds.X, 100, 1) {
		p1, _ := m.Predict(x)
		p2, _ := m2.Predict(x)
		if !reflect.DeepEqual(p1, p2) {
			t.Fatalf("prediction differs: %+v vs %+v", p1, p2)
		}
	}
	dir := t.TempDir()
	path := filepath.Join(dir, "m.tsf")
	if err := m.Save(path); err != nil {
		t.Fatal(err)
	}
	m3, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if m3.Source != path || !bytes.Equal(modelBytes(t, m3), b1) {
		t.Fatal("Save/Load round trip differs")
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 {
		t.Fatalf("Save left %d files, want 1", len(ents))
	}
}

// TestDamagedFile: every kind of damage is reported with the right
// sentinel, in one line naming the file.
func TestDamagedFile(t *testing.T) {
	m, _ := smallModel(t)
	good := modelBytes(t, m)
	hdrEnd := len(magic) + 2 + 2 // inside the header JSON
	mutate := func(f func([]byte) []byte) []byte { return f(bytes.Clone(good)) }
	flip := func(i int) []byte {
		return mutate(func(b []byte) []byte { b[i] ^= 0x10; return b })
	}
	newer := mutate(func(b []byte) []byte {
		binary.LittleEndian.PutUint16(b[len(magic):], FormatVersion+1)
		return b
	})
	tests := []struct {
		name string
		data []byte
		want error
	}{
		{"flip header byte", flip(hdrEnd + 10), ErrCorrupt},
		{"flip tree byte", flip(len(good) - 100), ErrCorrupt},
		{"flip checksum byte", flip(len(good) - 1), ErrCorrupt},
		{"truncated half", good[:len(good)/2], ErrCorrupt},
		{"truncated by one", good[:len(good)-1], ErrCorrupt},
		{"truncated in magic", good[:5], ErrCorrupt},
		{"empty", nil, ErrCorrupt},
		{"appended byte", append(bytes.Clone(good), 0), ErrCorrupt},
		{"wrong magic", flip(0), ErrBadMagic},
		{"other file", []byte("t,value\n0,1.5\n1,2.5\n"), ErrBadMagic},
		{"newer version", newer, ErrNewerFormat},
	}
	dir := t.TempDir()
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			path := filepath.Join(dir, strings.ReplaceAll(tc.name, " ", "_")+".tsf")
			if err := os.WriteFile(path, tc.data, 0o644); err != nil {
				t.Fatal(err)
			}
			_, err := Load(path)
			if !errors.Is(err, tc.want) {
				t.Fatalf("err %v, want %v", err, tc.want)
			}
			msg := err.Error()
			if !strings.Contains(msg, path) || strings.Contains(msg, "\n") {
				t.Fatalf("message %q should be one line naming %s", msg, path)
			}
		})
	}
}

// TestStructureCheckedBehindChecksum: a structurally broken tree section
// with a valid checksum (as a buggy writer would produce) is still caught.
func TestStructureCheckedBehindChecksum(t *testing.T) {
	m, _ := smallModel(t)
	bad := *m
	bad.trees = append([]tree(nil), m.trees...)
	tr := bad.trees[0]
	tr.nodes = append([]node(nil), tr.nodes...)
	tr.nodes[0].feature = int32(len(m.Features) + 3) // feature out of range
	bad.trees[0] = tr
	var b bytes.Buffer
	if err := bad.Write(&b); err != nil {
		t.Fatal(err)
	}
	if _, err := Read(&b); !errors.Is(err, ErrCorrupt) {
		t.Fatalf("err %v, want ErrCorrupt", err)
	}
}

// TestSchemaCheck: the stored schema is compared with the caller's.
func TestSchemaCheck(t *testing.T) {
	m, _ := smallModel(t)
	path := filepath.Join(t.TempDir(), "default.tsf")
	if err := m.Save(path); err != nil {
		t.Fatal(err)
	}
	lm, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := lm.CheckSchema(Schema{Version: 3, Hash: "abc123"}); err != nil {
		t.Fatalf("matching schema rejected: %v", err)
	}
	for _, want := range []Schema{{Version: 4, Hash: "abc123"}, {Version: 3, Hash: "abc124"}} {
		err := lm.CheckSchema(want)
		if !errors.Is(err, ErrSchemaMismatch) || !strings.Contains(err.Error(), path) {
			t.Fatalf("err %v, want ErrSchemaMismatch naming %s", err, path)
		}
	}
}

// rewriteHeader returns the model file b with its JSON header decoded,
// changed by edit and encoded again, the header length and the SHA-256
// checksum recomputed as Write computes them: a file that passes every
// check of Read, as one written by another build would.
func rewriteHeader(t *testing.T, b []byte, edit func(*Model)) []byte {
	t.Helper()
	off := len(magic) + 2
	hlen, n := binary.Uvarint(b[off:])
	if n <= 0 {
		t.Fatal("bad header length")
	}
	hdr := b[off+n : off+n+int(hlen)]
	rest := b[off+n+int(hlen) : len(b)-sha256.Size] // trees and novelty index
	var m Model
	if err := json.Unmarshal(hdr, &m); err != nil {
		t.Fatal(err)
	}
	edit(&m)
	hdr, err := json.Marshal(&m)
	if err != nil {
		t.Fatal(err)
	}
	out := append([]byte(nil), b[:off]...)
	out = binary.AppendUvarint(out, uint64(len(hdr)))
	out = append(out, hdr...)
	out = append(out, rest...)
	sum := sha256.Sum256(out)
	return append(out, sum[:]...)
}

// TestUnknownFeature: a model whose header names a feature this program's
// catalogue does not compute is refused by CheckSchema even though its
// schema and checksum are right (before, prediction replaced the feature by
// its training median on every trace, with a "not computable" note); a
// model that dropped a feature of the catalogue is accepted.
func TestUnknownFeature(t *testing.T) {
	current := Schema{Version: features.SchemaVersion, Hash: features.SchemaHash()}
	names := features.Names()[:6]
	ds := noisy(200, 6, 3, 21)
	ds.Features = names
	for _, x := range ds.X {
		x[5] = math.NaN() // missing in every row: Train drops it
	}
	m, err := Train(ds, Config{Trees: 15, Seed: 4, Schema: current})
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(m.Training.Dropped, names[5:]) || !slices.Equal(m.Features, names[:5]) {
		t.Fatalf("features %v, dropped %v", m.Features, m.Training.Dropped)
	}
	good := modelBytes(t, m)
	rename := func(j int, to string) func(*Model) {
		return func(m *Model) { m.Features[j] = to }
	}
	dir := t.TempDir()
	cases := []struct {
		name string
		data []byte
		want string // "" for accepted
	}{
		{"as trained, one feature dropped", good, ""},
		{"renamed feature", rewriteHeader(t, good, rename(2, "foo")),
			`model DIR/renamed_feature.tsf: names feature "foo" that this tracesift does not compute (model made by a different version?)`},
		// The dropped feature is not asked for, so it may be anything.
		{"unknown dropped feature", rewriteHeader(t, good, func(m *Model) { m.Training.Dropped = []string{"bar"} }), ""},
		{"long name shortened", rewriteHeader(t, good, rename(0, strings.Repeat("ab", 40))),
			`model DIR/long_name_shortened.tsf: names feature "` + strings.Repeat("ab", 29) + `"… that this tracesift does not compute (model made by a different version?)`},
	}
	for _, c := range cases {
		path := filepath.Join(dir, strings.ReplaceAll(c.name, " ", "_")+".tsf")
		if err := os.WriteFile(path, c.data, 0o644); err != nil {
			t.Fatal(err)
		}
		lm, err := Load(path)
		if err != nil {
			t.Fatalf("%s: load: %v", c.name, err)
		}
		err = lm.CheckSchema(current)
		want := strings.ReplaceAll(c.want, "DIR", dir)
		switch {
		case want == "" && err != nil:
			t.Errorf("%s: rejected: %v", c.name, err)
		case want != "" && (err == nil || err.Error() != want || !errors.Is(err, ErrSchemaMismatch)):
			t.Errorf("%s: error\n got %v\nwant %s (ErrSchemaMismatch)", c.name, err, want)
		}
	}
	// The feature names are only checked against this program's catalogue;
	// for another schema the classifier cannot know the names.
	other := Schema{Version: 3, Hash: "abc123"}
	lm, err := Read(bytes.NewReader(rewriteHeader(t, good, func(m *Model) {
		m.Features[2] = "foo"
		m.Config.Schema = other
	})))
	if err != nil {
		t.Fatal(err)
	}
	if err := lm.CheckSchema(other); err != nil {
		t.Fatalf("other schema: %v", err)
	}
}

// TestModelSize keeps the file compact: about 2 bytes of header per node
// plus 8 per threshold.
func TestModelSize(t *testing.T) {
	m, _ := smallModel(t)
	b := modelBytes(t, m)
	perNode := float64(len(b)) / float64(m.NumNodes())
	t.Logf("%d trees, %d nodes, %d bytes (%.1f bytes/node)", m.NumTrees(), m.NumNodes(), len(b), perNode)
	if perNode > 12 {
		t.Fatalf("%.1f bytes per node; the format spends ≤ 1+8 per split and ≤ 1+K·varint per leaf", perNode)
	}
}

// FuzzRead: Read must never panic; whatever it accepts must predict and
// write back to the same bytes (all our files are canonical; random bytes
// almost never pass the checksum, see FuzzReadBody for the parser).
func FuzzRead(f *testing.F) {
	m, _ := smallModel(f)
	var b bytes.Buffer
	if err := m.Write(&b); err != nil {
		f.Fatal(err)
	}
	f.Add(b.Bytes())
	f.Add(b.Bytes()[:40])
	f.Add([]byte(magic))
	f.Add([]byte{})
	f.Fuzz(func(t *testing.T, data []byte) {
		m, err := Read(bytes.NewReader(data))
		if err != nil {
			return
		}
		var out bytes.Buffer
		if err := m.Write(&out); err != nil {
			t.Fatalf("accepted model does not write: %v", err)
		}
		if !bytes.Equal(out.Bytes(), data) {
			t.Fatal("accepted model re-writes differently")
		}
	})
}

// FuzzReadBody fuzzes the part behind the checksum: the input is a file
// body to which the correct SHA-256 is appended, so the structure checks
// are exercised. Read must not panic, and an accepted model must predict.
func FuzzReadBody(f *testing.F) {
	m, _ := smallModel(f)
	var b bytes.Buffer
	if err := m.Write(&b); err != nil {
		f.Fatal(err)
	}
	body := b.Bytes()[:b.Len()-sha256.Size]
	f.Add(body)
	f.Add(body[:len(body)/2])
	f.Fuzz(func(t *testing.T, body []byte) {
		sum := sha256.Sum256(body)
		m, err := Read(bytes.NewReader(append(bytes.Clone(body), sum[:]...)))
		if err != nil {
			return
		}
		if _, err := m.Predict(make([]float64, len(m.Features))); err != nil {
			t.Fatalf("accepted model cannot predict: %v", err)
		}
	})
}
