//go:build amd64 && !amd64.v3

package demo

// exactPlatform reports that this build reproduces the committed trace files
// bit for bit: they were generated on amd64 at GOAMD64=v1, where the
// compiler never fuses x*y + z into one rounding. (Builds at v3 and above,
// and arm64, ppc64 and s390x, may fuse; a one-ulp change in a chaotic orbit
// grows to a visible one within the record.)
const exactPlatform = true
