//go:build !linux

package generators

import "time"

// threadCPU is unavailable outside Linux; benchmarks then report 0.
func threadCPU() time.Duration { return 0 }

func lockThread()   {}
func unlockThread() {}
