//go:build !(linux || darwin || freebsd || netbsd || openbsd || dragonfly)

package journal

import "os"

// lock is a no-op where flock is not available: the caller must not start
// two runs on one journal.
func lock(*os.File) error { return nil }
