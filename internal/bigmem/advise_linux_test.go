package bigmem

import (
	"bufio"
	"os"
	"strconv"
	"strings"
	"testing"
	"unsafe"
)

// TestAdviseMarksMapping reads the kernel's account of the process's
// mappings (/proc/self/smaps, proc(5)): the mapping that holds a large
// slice from Make must carry the "hg" flag (huge pages advised).
func TestAdviseMarksMapping(t *testing.T) {
	if _, err := os.Stat("/sys/kernel/mm/transparent_hugepage/enabled"); err != nil {
		t.Skip("this kernel has no transparent huge pages")
	}
	s := Make[float64](4 * Threshold / 8)
	addr := uintptr(unsafe.Pointer(&s[len(s)/2]))
	flags, ok := vmFlags(t, addr)
	if !ok {
		t.Fatalf("no mapping in /proc/self/smaps holds %#x", addr)
	}
	if !strings.Contains(" "+flags+" ", " hg ") {
		t.Errorf("mapping of a %d-byte slice has VmFlags %q, without hg (huge pages advised)", len(s)*8, flags)
	}
	s[0] = 1
}

// vmFlags returns the VmFlags line of the mapping that holds addr.
func vmFlags(t *testing.T, addr uintptr) (string, bool) {
	f, err := os.Open("/proc/self/smaps")
	if err != nil {
		t.Skip(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	inside := false
	for sc.Scan() {
		line := sc.Text()
		fields := strings.Fields(line)
		if len(fields) > 0 && strings.Contains(fields[0], "-") && !strings.HasSuffix(fields[0], ":") {
			lo, hi, _ := strings.Cut(fields[0], "-")
			a, err1 := strconv.ParseUint(lo, 16, 64)
			b, err2 := strconv.ParseUint(hi, 16, 64)
			inside = err1 == nil && err2 == nil && uint64(addr) >= a && uint64(addr) < b
			continue
		}
		if inside && strings.HasPrefix(line, "VmFlags:") {
			return strings.TrimSpace(strings.TrimPrefix(line, "VmFlags:")), true
		}
	}
	return "", false
}
