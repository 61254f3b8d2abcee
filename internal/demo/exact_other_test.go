//go:build !amd64 || amd64.v3

package demo

// exactPlatform is false where the compiler may fuse multiply-adds (see
// exact_amd64_test.go): the trace bytes are then not compared.
const exactPlatform = false
