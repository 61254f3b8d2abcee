package surrogate

import (
	"encoding/binary"
	"math/rand/v2"
)

// surrogateRand returns the random generator of surrogate i for a seed: a
// ChaCha8 stream keyed by (seed, i) and a fixed domain tag. Distinct keys give
// independent streams (ChaCha8 is a stream cipher), so each surrogate's draws
// do not depend on which worker makes it or in what order.
func surrogateRand(seed uint64, i int) *rand.Rand {
	var key [32]byte
	binary.LittleEndian.PutUint64(key[0:8], seed)
	binary.LittleEndian.PutUint64(key[8:16], uint64(i))
	copy(key[16:], "tracesift/surr\x00\x01")
	return rand.New(rand.NewChaCha8(key))
}
