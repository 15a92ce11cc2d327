package exacttest_test

import (
	"os/exec"
	"strings"
	"testing"
)

// TestExactDoesNotLinkTesting: a program that imports exact to solve
// levels must not link the testing package; the *testing.T harness lives
// here instead (as testing/fstest keeps fstest.TestFS out of io/fs).
func TestExactDoesNotLinkTesting(t *testing.T) {
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go command on PATH")
	}
	for _, pkg := range []string{"github.com/tiltwell/tiltwell", "github.com/tiltwell/tiltwell/exact"} {
		out, err := exec.Command(goTool, "list", "-deps", pkg).Output()
		if err != nil {
			t.Fatalf("go list -deps %s: %v", pkg, err)
		}
		for _, dep := range strings.Fields(string(out)) {
			if dep == "testing" {
				t.Errorf("%s links the testing package", pkg)
			}
		}
	}
}
