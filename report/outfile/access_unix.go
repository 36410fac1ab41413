//go:build unix

package outfile

import "syscall"

// accessWrite is W_OK of access(2) (<unistd.h>).
const accessWrite = 2

// mayWrite reports whether access(2) lets this process write path.
func mayWrite(path string) bool { return syscall.Access(path, accessWrite) == nil }
