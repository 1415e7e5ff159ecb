package main

import (
	"context"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"flag"
	"fmt"
	"io"
	"net"
	"os"
	"os/signal"
	"path/filepath"
	"syscall"
	"time"

	charmlog "github.com/charmbracelet/log"

	"likewind/envelope/session"
	"likewind/tui"
	"likewind/tui/review"
)

// serveOptions is a parsed serve command line.
type serveOptions struct {
	files       []string
	listen      string
	keys        string
	hostKey     string
	sessionPath string
	fresh       bool
	maxConns    int
	idle        time.Duration
	dumpDir     string
}

// defaultListen is where a review listens unless told otherwise: this
// machine only.
const defaultListen = "127.0.0.1:2290"

// errFlagsPrinted is a bad flag whose message and usage the flag package
// has printed already.
var errFlagsPrinted = errors.New("bad flag")

func parseServeFlags(args []string, stderr io.Writer) (serveOptions, error) {
	fs := flag.NewFlagSet("likewind serve", flag.ContinueOnError)
	fs.SetOutput(stderr)
	var o serveOptions
	fs.StringVar(&o.listen, "listen", defaultListen, "address to listen on, host:port; a non-loopback address lets the network in (listen only on networks the lab trusts)")
	fs.StringVar(&o.keys, "authorized-keys", "", "reviewers' public keys, OpenSSH authorized-keys format; likewind-role=editor marks an editor (default: authorized_keys in the state folder)")
	fs.StringVar(&o.hostKey, "host-key", "", "the server's host key, made on first start (default: review_host_ed25519 in the state folder)")
	fs.StringVar(&o.sessionPath, "session", "", "the shared session file, saved on every change and restored on start (default: one per set of input files in the state folder)")
	fs.BoolVar(&o.fresh, "fresh", false, "start from the files' values; a saved session is kept beside")
	fs.IntVar(&o.maxConns, "max-conns", review.DefaultMaxConns, "reviewers connected at once")
	fs.DurationVar(&o.idle, "idle-timeout", review.DefaultIdleTimeout, "end a connection without traffic for this long")
	fs.StringVar(&o.dumpDir, "dump-dir", "", "folder for the write key's dumps of editors and of viewers marked likewind-dumps (default: the current folder)")
	fs.Usage = func() {
		fmt.Fprintln(stderr, "usage: likewind serve [FILES] [--listen ADDR] [--authorized-keys FILE] [--session FILE]")
		fmt.Fprintln(stderr, "\nserve options:")
		fs.PrintDefaults()
	}
	files, code := parseArgs(fs, args, stderr)
	switch code {
	case 0:
		return serveOptions{}, flag.ErrHelp
	case 2:
		return serveOptions{}, errFlagsPrinted
	}
	o.files = files
	if o.maxConns < 1 {
		return serveOptions{}, usagef("--max-conns %d: expected at least 1", o.maxConns)
	}
	if o.idle < time.Second {
		return serveOptions{}, usagef("--idle-timeout %v: expected at least 1s (e.g. 30m)", o.idle)
	}
	if _, _, err := net.SplitHostPort(o.listen); err != nil {
		return serveOptions{}, usagef("--listen %q: expected host:port, e.g. 127.0.0.1:2290", o.listen)
	}
	return o, nil
}

// stateDir is likewind's state folder ($XDG_STATE_HOME/likewind or
// ~/.local/state/likewind), made 0700.
func stateDir() (string, error) {
	dir := os.Getenv("XDG_STATE_HOME")
	if dir == "" {
		home, err := os.UserHomeDir()
		if err != nil {
			return "", fmt.Errorf("state folder: %w", err)
		}
		dir = filepath.Join(home, ".local", "state")
	}
	dir = filepath.Join(dir, "likewind")
	if err := os.MkdirAll(dir, 0o700); err != nil {
		return "", fmt.Errorf("state folder: %w", err)
	}
	return dir, nil
}

// runServe starts a design-review server and runs until a signal.
func runServe(args []string, stdout, stderr io.Writer) int {
	o, err := parseServeFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	if errors.Is(err, errFlagsPrinted) {
		return 2
	}
	if err != nil {
		fmt.Fprintln(stderr, "likewind:", err)
		return 2
	}
	fail := func(err error) int {
		fmt.Fprintln(stderr, "likewind:", err)
		return 1
	}
	in, err := loadInputs(o.files)
	if err != nil {
		var ue usageError
		if errors.As(err, &ue) {
			fmt.Fprintln(stderr, "likewind:", err)
			return 2
		}
		fmt.Fprintln(stderr, err)
		return 1
	}
	hash := session.DataHash(in.vehicle, in.facilities)
	if len(in.files) > 0 {
		if hash, err = session.HashFiles(in.files...); err != nil {
			return fail(err)
		}
	}
	state, err := stateDir()
	if err != nil && (o.keys == "" || o.hostKey == "" || o.sessionPath == "") {
		return fail(err)
	}
	if o.keys == "" {
		o.keys = filepath.Join(state, "authorized_keys")
	}
	if o.hostKey == "" {
		o.hostKey = filepath.Join(state, "review_host_ed25519")
	}
	if o.sessionPath == "" {
		sum := sha256.Sum256([]byte(hash))
		o.sessionPath = filepath.Join(state, "review-"+hex.EncodeToString(sum[:6])+".json")
	}
	if o.dumpDir == "" {
		if o.dumpDir, err = os.Getwd(); err != nil {
			return fail(fmt.Errorf("dump folder: %w", err))
		}
	}
	keys, err := review.LoadKeys(o.keys)
	if err != nil {
		return fail(err)
	}
	host, made, err := review.HostKey(o.hostKey)
	if err != nil {
		return fail(err)
	}

	// The shared session, locked as the single-user interface locks its
	// own: a second server (or interface) on it is refused.
	sf, err := session.Open(o.sessionPath, in.files, hash)
	if err != nil {
		return fail(err)
	}
	defer sf.Close()
	if why := sf.Refused(); why != nil {
		return fail(fmt.Errorf("session file %s %v; it is left as it is: give another --session file", o.sessionPath, why))
	}
	if ro, holder := sf.ReadOnly(); ro {
		return fail(fmt.Errorf("session file %s is in use by another likewind (%s); give another --session file", o.sessionPath, holder))
	}
	opts := tui.Options{
		Vehicle: in.vehicle, Facilities: in.facilities, Inputs: in.files, InputHash: hash,
		Version: version,
	}
	found, ok := sf.Found()
	restored := ok && !o.fresh
	if restored {
		opts.Session = &found
	}
	base := tui.New(opts)
	logf := func(format string, a ...any) {
		fmt.Fprintf(stderr, "%s %s\n", time.Now().UTC().Format("15:04:05"), fmt.Sprintf(format, a...))
	}
	hub := review.NewHub(base, sf, ok && !restored, logf)
	defer hub.Close()

	ln, err := net.Listen("tcp", o.listen)
	if err != nil {
		return fail(fmt.Errorf("listen: %w", err))
	}
	srv, err := review.NewServer(review.Config{
		Hub: hub, Base: base, Keys: keys, Host: host,
		MaxConns: o.maxConns, IdleTimeout: o.idle, DumpDir: o.dumpDir,
		SessionPath: o.sessionPath, Logf: logf,
	})
	if err != nil {
		ln.Close()
		return fail(err)
	}
	addr := ln.Addr().String()
	hostName, port, _ := net.SplitHostPort(addr)
	if made {
		fmt.Fprintf(stdout, "host key made: %s\n", o.hostKey)
	}
	fmt.Fprintf(stdout, "likewind review on %s (%s: %s, %s; up to %d connections)\n", addr,
		plural(keys.Len(), "key", "keys"), plural(keys.Editors(), "editor", "editors"), plural(keys.Len()-keys.Editors(), "viewer", "viewers"), o.maxConns)
	fmt.Fprintf(stdout, "host key fingerprint %s\n", review.Fingerprint(host))
	fmt.Fprintf(stdout, "reviewers join with: ssh -p %s %s\n", port, hostName)
	if restored {
		fmt.Fprintf(stdout, "session restored from %s (%d marks)\n", o.sessionPath, len(found.Marks))
	} else {
		fmt.Fprintf(stdout, "session saved to %s on every change\n", o.sessionPath)
	}
	if note := listenCaution(addr); note != "" {
		fmt.Fprintln(stdout, note)
	}

	// wish logs each ended program as an error; the hub's own lines say
	// who came and went.
	charmlog.SetOutput(io.Discard)

	ctx, stop := signal.NotifyContext(context.Background(), syscall.SIGHUP, syscall.SIGTERM, syscall.SIGINT)
	defer stop()
	served := make(chan error, 1)
	go func() { served <- srv.Serve(ln) }()
	var serveErr error
	select {
	case <-ctx.Done():
	case serveErr = <-served:
	}
	stop()
	sctx, cancel := context.WithTimeout(context.Background(), 5*time.Second)
	_ = srv.Shutdown(sctx)
	cancel()
	if !restored {
		hub.MarkDirty()
	}
	if err := hub.Flush(); err != nil {
		return fail(err)
	}
	fmt.Fprintf(stdout, "review ended; session in %s\n", sf.Path())
	if serveErr != nil {
		return fail(serveErr)
	}
	return 0
}

// listenCaution is the caution printed when the server listens where
// other machines can reach it ("" on a loopback address).
func listenCaution(addr string) string {
	if review.IsLoopback(addr) {
		return ""
	}
	return fmt.Sprintf("CAUTION: %s is reachable from the network: anyone who can reach it can try to log in; "+
		"listen only on networks the lab trusts (the default, 127.0.0.1, keeps the review on this machine; reviewers elsewhere can use an SSH tunnel)", addr)
}
