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

	"likewind/envelope/session"
	"likewind/tui"
)

// openOptions is a parsed interface command line.
type openOptions struct {
	files       []string
	sessionPath string
	restore     bool
	fresh       bool
}

// parseOpenFlags reads the interface command line, options before or
// after the file names (parseArgs). code is -1 to go on, else the exit
// code: 0 after help, 2 after a bad flag (the flag package has printed
// it) or a bad combination (printed here).
func parseOpenFlags(args []string, stderr io.Writer) (o openOptions, code int) {
	fs := flag.NewFlagSet("likewind", flag.ContinueOnError)
	fs.SetOutput(stderr)
	sessionPath := fs.String("session", "", "session file to save to and restore from (default: one per set of input files in the user state folder)")
	restore := fs.Bool("restore", false, "restore the saved session without asking")
	fresh := fs.Bool("fresh", false, "start from the files' values and ignore a saved session")
	fs.Usage = func() { printUsage(stderr); fmt.Fprintln(stderr, "\ninterface options:"); fs.PrintDefaults() }
	files, code := parseArgs(fs, args, stderr)
	if code >= 0 {
		return openOptions{}, code
	}
	if *restore && *fresh {
		fmt.Fprintln(stderr, "likewind:", usagef("give at most one of --restore and --fresh"))
		return openOptions{}, 2
	}
	return openOptions{files: files, sessionPath: *sessionPath, restore: *restore, fresh: *fresh}, -1
}

// runOpen opens the interactive interface on the given files or the demo.
func runOpen(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	o, code := parseOpenFlags(args, stderr)
	if code >= 0 {
		return code
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

	hash := session.DataHash(in.vehicle, in.facilities)
	if len(in.files) > 0 {
		if hash, err = session.HashFiles(in.files...); err != nil {
			fmt.Fprintln(stderr, "likewind:", err)
			return 1
		}
	}

	// The session file: the one given, which must be a session of these
	// inputs (or not exist yet), or the default one per set of inputs.
	// Either is locked while the interface runs.
	var sf *session.File
	var note string
	if o.sessionPath != "" {
		sf, err = session.Open(o.sessionPath, in.files, hash)
		if err != nil {
			fmt.Fprintln(stderr, "likewind:", err)
			return 1
		}
		if why := sf.Refused(); why != nil {
			sf.Close()
			fmt.Fprintf(stderr, "likewind: session file %s %v.\nIt is left as it is; give another --session file (a new name starts a new session), or none for the default one.\n", o.sessionPath, why)
			return 1
		}
	} else if def, derr := defaultSessionPath(hash); derr != nil {
		fmt.Fprintln(stderr, "likewind: no session file will be kept:", derr)
	} else if sf, note, err = openDefaultSession(def, in.files, hash); err != nil {
		fmt.Fprintln(stderr, "likewind: no session file will be kept:", err)
	}
	if sf != nil {
		defer sf.Close()
	}

	// The interface draws on standard output and reads keys from standard
	// input: without a terminal on both it cannot start, and nothing is
	// written.
	if !isTerminal(stdin) || !isTerminal(stdout) {
		fmt.Fprintln(stderr, "likewind: the interface needs a terminal on standard input and output; "+
			"for files use dump, export, plot, coverage or runs (likewind help)")
		return 1
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
		SessionFile: sf,
		SessionNote: note,
		DumpDir:     dumpDir,
		Version:     version,
		Width:       80,
		Height:      24,
	}
	if sf != nil && !o.fresh {
		if s, ok := offerSession(sf, o.restore, stdin, stderr); ok {
			opts.Session = &s
		}
	}
	styles := tui.NewStyles(lipgloss.NewRenderer(os.Stdout))
	opts.Styles = &styles

	// A dropped SSH connection (SIGHUP), a polite kill (SIGTERM) or an
	// interrupt (SIGINT) ends the program through its context; tui.Run
	// then writes what was not saved yet.
	ctx, stop := signal.NotifyContext(context.Background(), syscall.SIGHUP, syscall.SIGTERM, syscall.SIGINT)
	defer stop()
	m, err := tui.Run(ctx, opts)
	for _, line := range m.SaveReport() {
		fmt.Fprintln(stdout, line)
	}
	if errors.Is(err, tui.ErrSessionNotSaved) {
		fmt.Fprintln(stderr, "likewind:", err)
		return 1
	}
	if err != nil && !errors.Is(err, tea.ErrProgramKilled) {
		fmt.Fprintln(stderr, "likewind:", err)
		return 1
	}
	return 0
}

// isTerminal reports whether f is a terminal.
func isTerminal(f any) bool {
	file, ok := f.(*os.File)
	return ok && (isatty.IsTerminal(file.Fd()) || isatty.IsCygwinTerminal(file.Fd()))
}

// defaultSessionPath is the session file kept for one set of input data:
// $XDG_STATE_HOME/likewind (or ~/.local/state/likewind, created 0700)
// named by the data's hash, so the next start on the same files finds it.
func defaultSessionPath(hash string) (string, error) {
	dir, err := stateDir()
	if err != nil {
		return "", err
	}
	sum := sha256.Sum256([]byte(hash))
	return filepath.Join(dir, "session-"+hex.EncodeToString(sum[:6])+".json"), nil
}

// openDefaultSession opens the default session file, or, when the file
// there cannot be used (not a session of these inputs), keeps it and uses
// the first numbered name beside it that is free or holds a session of
// these inputs. note says so, for the screen.
func openDefaultSession(path string, files []string, hash string) (*session.File, string, error) {
	var refused []string
	for n := 0; n < 100; n++ {
		p := path
		if n > 0 {
			ext := filepath.Ext(path)
			p = fmt.Sprintf("%s.%d%s", strings.TrimSuffix(path, ext), n, ext)
		}
		sf, err := session.Open(p, files, hash)
		if err != nil {
			return nil, "", err
		}
		why := sf.Refused()
		if why == nil {
			note := ""
			if len(refused) > 0 {
				note = fmt.Sprintf("%s; kept as it is: this session is saved to %s", strings.Join(refused, "; "), p)
			}
			return sf, note, nil
		}
		sf.Close()
		refused = append(refused, fmt.Sprintf("%s %v", p, why))
	}
	return nil, "", fmt.Errorf("%s and 99 numbered files beside it are not sessions of these files", path)
}

// offerSession offers the session found in the session file: it asks
// whether to restore it (or restores it at once with --restore). Not
// restoring keeps it: it is moved beside under a numbered name before this
// session is first saved.
func offerSession(sf *session.File, restore bool, stdin io.Reader, stderr io.Writer) (session.Session, bool) {
	s, ok := sf.Found()
	if !ok {
		return session.Session{}, false
	}
	if restore {
		return s, true
	}
	if !isTerminal(stdin) {
		return session.Session{}, false
	}
	fmt.Fprintf(stderr, "A saved session for these files exists (%s): %d marked point(s).\n"+
		"Restore it? [Y/n] (n starts from the files' values and keeps the saved session) ", sf.Path(), len(s.Marks))
	answer, _ := bufio.NewReader(stdin).ReadString('\n')
	answer = strings.ToLower(strings.TrimSpace(answer))
	return s, answer == "" || answer == "y" || answer == "yes"
}
