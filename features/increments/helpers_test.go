package increments

import "github.com/tracesift/tracesift/features/scaling"

func decayLags(k int) scaling.DecayOptions { return scaling.DecayOptions{MaxLag: k} }
