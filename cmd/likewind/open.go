package main

import (
	"bufio"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strings"
	"syscall"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/mattn/go-isatty"

	"likewind/tui"
)

// openOptions is a parsed interface command line.
type openOptions struct {
	files       []string
	sessionPath string
	restore     bool
	fresh       bool
}

func parseOpenFlags(args []string, stderr io.Writer) (openOptions, error) {
	fs := flag.NewFlagSet("likewind", flag.ContinueOnError)
	fs.SetOutput(stderr)
	session := fs.String("session", "", "session file to save to and restore from (default: one per set of input files in the user state folder)")
	restore := fs.Bool("restore", false, "restore the saved session without asking")
	fresh := fs.Bool("fresh", false, "start from the files' values and ignore a saved session")
	fs.Usage = func() { printUsage(stderr); fmt.Fprintln(stderr, "\ninterface options:"); fs.PrintDefaults() }
	// Allow options before or after the file names.
	var files []string
	rest := args
	for {
		if err := fs.Parse(rest); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return openOptions{}, err
			}
			return openOptions{}, usageError{err}
		}
		if fs.NArg() == 0 {
			break
		}
		files = append(files, fs.Arg(0))
		rest = fs.Args()[1:]
	}
	if *restore && *fresh {
		return openOptions{}, usagef("give at most one of --restore and --fresh")
	}
	return openOptions{files: files, sessionPath: *session, restore: *restore, fresh: *fresh}, nil
}

// runOpen opens the interactive interface on the given files or the demo.
func runOpen(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	o, err := parseOpenFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	if err != nil {
		fmt.Fprintln(stderr, "likewind:", err)
		return 2
	}
	in, err := loadInputs(o.files)
	if err != nil {
		var ue usageError
		if errors.As(err, &ue) {
			fmt.Fprintln(stderr, "likewind:", err)
			return 2
		}
		fmt.Fprintln(stderr, err) // file problems, one per line, each naming its file
		return 1
	}

	hash := tui.DataHash(in.vehicle, in.facilities)
	if len(in.files) > 0 {
		if hash, err = tui.HashFiles(in.files...); err != nil {
			fmt.Fprintln(stderr, "likewind:", err)
			return 1
		}
	}
	sessionPath := o.sessionPath
	if sessionPath == "" {
		sessionPath, err = defaultSessionPath(hash)
		if err != nil {
			fmt.Fprintln(stderr, "likewind: no session file will be kept:", err)
		}
	}

	// The write key puts text dumps of the view in the folder the tool was
	// started from.
	dumpDir, err := os.Getwd()
	if err != nil {
		fmt.Fprintln(stderr, "likewind: the view cannot be written to files:", err)
		dumpDir = ""
	}
	opts := tui.Options{
		Vehicle:     in.vehicle,
		Facilities:  in.facilities,
		Inputs:      in.files,
		InputHash:   hash,
		SessionPath: sessionPath,
		DumpDir:     dumpDir,
		Version:     version,
		Width:       80,
		Height:      24,
	}
	if sessionPath != "" && !o.fresh {
		if s, ok := offerSession(sessionPath, in.files, hash, o.restore, stdin, stderr); ok {
			opts.Session = &s
		}
	}
	styles := tui.NewStyles(lipgloss.NewRenderer(os.Stdout))
	opts.Styles = &styles

	// A dropped SSH connection (SIGHUP), a polite kill (SIGTERM) or an
	// interrupt when input is not a terminal (SIGINT) ends the program
	// through its context; tui.Run then writes the session.
	ctx, stop := signal.NotifyContext(context.Background(), syscall.SIGHUP, syscall.SIGTERM, syscall.SIGINT)
	defer stop()
	m, err := tui.Run(ctx, opts)
	if errors.Is(err, tui.ErrSessionNotSaved) {
		fmt.Fprintln(stderr, "likewind:", err)
		return 1
	}
	if m.WantsSave() {
		fmt.Fprintf(stdout, "session saved to %s\n", sessionPath)
	}
	if err != nil && !errors.Is(err, tea.ErrProgramKilled) {
		fmt.Fprintln(stderr, "likewind:", err)
		return 1
	}
	return 0
}

// defaultSessionPath is the session file kept for one set of input data:
// $XDG_STATE_HOME/likewind (or ~/.local/state/likewind) named by the data's
// hash, so the next start on the same files finds it.
func defaultSessionPath(hash string) (string, error) {
	dir := os.Getenv("XDG_STATE_HOME")
	if dir == "" {
		home, err := os.UserHomeDir()
		if err != nil {
			return "", fmt.Errorf("session folder: %w", err)
		}
		dir = filepath.Join(home, ".local", "state")
	}
	dir = filepath.Join(dir, "likewind")
	if err := os.MkdirAll(dir, 0o700); err != nil {
		return "", fmt.Errorf("session folder: %w", err)
	}
	sum := sha256.Sum256([]byte(hash))
	return filepath.Join(dir, "session-"+hex.EncodeToString(sum[:6])+".json"), nil
}

// offerSession looks for a saved session at path; when it belongs to the
// same input data it asks whether to restore it (or restores it at once
// with --restore). A corrupt or foreign session is reported and ignored.
func offerSession(path string, files []string, hash string, restore bool, stdin io.Reader, stderr io.Writer) (tui.Session, bool) {
	if _, err := os.Stat(path); err != nil {
		return tui.Session{}, false
	}
	s, err := tui.LoadSession(path)
	if err != nil {
		fmt.Fprintf(stderr, "likewind: ignoring the saved session: %v\n", err)
		return tui.Session{}, false
	}
	if err := tui.CheckSession(s, files, hash); err != nil {
		fmt.Fprintf(stderr, "likewind: ignoring the saved session %s: %v\n", path, err)
		return tui.Session{}, false
	}
	if restore {
		return s, true
	}
	if f, ok := stdin.(*os.File); !ok || !isatty.IsTerminal(f.Fd()) {
		return tui.Session{}, false
	}
	fmt.Fprintf(stderr, "A saved session for these files exists (%s): %d marked point(s).\nRestore it? [Y/n] ", path, len(s.Marks))
	answer, _ := bufio.NewReader(stdin).ReadString('\n')
	answer = strings.ToLower(strings.TrimSpace(answer))
	return s, answer == "" || answer == "y" || answer == "yes"
}
