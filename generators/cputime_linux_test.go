//go:build linux

package generators

import (
	"runtime"
	"syscall"
	"time"
)

// threadCPU returns the CPU time consumed so far by the calling OS thread
// (getrusage RUSAGE_THREAD). Benchmarks lock their goroutine to its thread
// and report this beside the wall time, which on a shared machine depends
// on the load.
func threadCPU() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(1 /* RUSAGE_THREAD */, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

func lockThread()   { runtime.LockOSThread() }
func unlockThread() { runtime.UnlockOSThread() }
