package network

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// ReadFile refuses devices, which may never end, without reading them.
func TestReadFileRefusesDevices(t *testing.T) {
	if _, err := os.Stat("/dev/zero"); err != nil {
		t.Skip("no /dev/zero here")
	}
	_, err := ReadFile("/dev/zero")
	if err == nil || !strings.Contains(err.Error(), "/dev/zero: is a device, not a model file") {
		t.Errorf("got %v", err)
	}
}

func TestReadFileRefusesDirectories(t *testing.T) {
	_, err := ReadFile(t.TempDir())
	if err == nil || !strings.Contains(err.Error(), "is a directory") {
		t.Errorf("got %v", err)
	}
}

// A file larger than the limit is refused by its size, before it is read.
func TestReadFileRefusesLargeFiles(t *testing.T) {
	path := filepath.Join(t.TempDir(), "big.yaml")
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(MaxFileSize + 1); err != nil { // sparse: no disk used
		t.Fatal(err)
	}
	f.Close()
	_, err = ReadFile(path)
	if err == nil || !strings.Contains(err.Error(), "big.yaml: file is larger than the 16 MiB limit") {
		t.Errorf("got %v", err)
	}
}
