package rockheat

import (
	"bufio"
	"fmt"
	"os"
	"os/exec"
	"strings"
	"testing"
	"unsafe"
)

// TestHugeHeapAdvised: in a fresh process, as the command runs, a large
// allocation made after AdviseHugeHeap lands in memory that carries the
// huge-page advice, as the kernel reports it: "hg" among the VmFlags of
// its mapping in /proc/self/smaps (proc(5)); and without the advice
// (GODEBUG=disablethp=1) it does not. The check runs in a child process
// (this test binary again), whose heap no other test has used.
func TestHugeHeapAdvised(t *testing.T) {
	if os.Getenv("ROCKHEAT_HUGEHEAP_CHILD") == "1" {
		AdviseHugeHeap()
		x := make([]float64, 1<<20) // 8 MB, as a run's columns
		x[0] = 1
		flags, err := vmFlags(uintptr(unsafe.Pointer(&x[0])))
		if err != nil {
			fmt.Println("unreadable:", err)
			return
		}
		fmt.Printf("flags: %s\n", flags)
		return
	}
	t.Parallel()
	for _, c := range []struct {
		godebug string
		want    bool
	}{{"", true}, {"disablethp=1", false}} {
		cmd := exec.Command(os.Args[0], "-test.run=^TestHugeHeapAdvised$", "-test.count=1")
		cmd.Env = append(os.Environ(), "ROCKHEAT_HUGEHEAP_CHILD=1", "GODEBUG="+c.godebug)
		out, err := cmd.CombinedOutput()
		if err != nil {
			t.Fatalf("child with GODEBUG=%q: %v\n%s", c.godebug, err, out)
		}
		if strings.Contains(string(out), "unreadable:") {
			t.Skipf("cannot read the mappings: %s", out)
		}
		_, flags, ok := strings.Cut(string(out), "flags: ")
		if !ok {
			t.Fatalf("child with GODEBUG=%q printed no flags:\n%s", c.godebug, out)
		}
		flags, _, _ = strings.Cut(flags, "\n")
		if got := strings.Contains(" "+flags+" ", " hg "); got != c.want {
			t.Errorf("GODEBUG=%q: the mapping of a fresh 8 MB slice has VmFlags %q; huge-page advice (hg) %v, want %v", c.godebug, flags, got, c.want)
		}
	}
}

// vmFlags returns the VmFlags of the mapping of /proc/self/smaps that
// holds address a.
func vmFlags(a uintptr) (string, error) {
	f, err := os.Open("/proc/self/smaps")
	if err != nil {
		return "", err
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	in := false
	for sc.Scan() {
		line := sc.Text()
		var lo, hi uintptr
		if n, _ := fmt.Sscanf(line, "%x-%x", &lo, &hi); n == 2 && !strings.HasSuffix(strings.Fields(line)[0], ":") {
			in = lo <= a && a < hi
			continue
		}
		if flags, ok := strings.CutPrefix(line, "VmFlags:"); ok && in {
			return strings.TrimSpace(flags), nil
		}
	}
	if err := sc.Err(); err != nil {
		return "", err
	}
	return "", fmt.Errorf("no mapping holds %#x", a)
}
