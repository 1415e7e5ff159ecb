// Command likewind plans ground tests across a flight vehicle's
// altitude–speed envelope: which flight conditions a wind or water tunnel can
// reproduce with a scale model, and how far short it falls elsewhere.
//
// Usage:
//
//	likewind                                 interface on the embedded demo
//	likewind VEHICLE.toml FACILITIES.toml... interface on your own files
//	likewind point --alt 11km --mach 0.8 --length 3.5m [--dt 10K] [--json]
//	likewind check FILE...
//
// Results are planning estimates; see README for the safety cautions.
package main

import (
	"fmt"
	"io"
	"os"

	"likewind/envelope"
)

const version = "0.1.0"

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}

// run dispatches a command line and returns the exit status: 0 success,
// 1 a failure of the work itself (e.g. invalid files), 2 bad usage.
func run(args []string, stdin io.Reader, stdout, stderr io.Writer) int {
	// Messages quote file names, names and keys from files: none of them
	// may drive the terminal (the last of the walls against hostile text).
	stderr = envelope.CleanWriter{W: stderr}
	if len(args) > 0 {
		switch args[0] {
		case "point":
			return runPoint(args[1:], stdout, stderr)
		case "check":
			return runCheck(args[1:], stdout, stderr)
		case "dump":
			return runDump(args[1:], stdout, stderr)
		case "export":
			return runExport(args[1:], stdout, stderr)
		case "plot":
			return runPlot(args[1:], stdout, stderr)
		case "coverage":
			return runCoverage(args[1:], stdout, stderr)
		case "scales":
			return runScales(args[1:], stdout, stderr)
		case "runs":
			return runRuns(args[1:], stdout, stderr)
		case "report":
			return runReport(args[1:], stdout, stderr)
		case "serve":
			return runServe(args[1:], stdout, stderr)
		case "help", "-h", "--help", "-help":
			return reportWrite(printUsage(stdout), stderr)
		case "version", "--version":
			_, err := fmt.Fprintln(stdout, "likewind", version)
			return reportWrite(err, stderr)
		}
	}
	return runOpen(args, stdin, stdout, stderr)
}

// reportWrite turns a failed write to standard output into a message and
// exit status 1.
func reportWrite(err error, stderr io.Writer) int {
	if err != nil {
		fmt.Fprintln(stderr, "likewind: standard output:", err)
		return 1
	}
	return 0
}

func printUsage(w io.Writer) error {
	_, err := fmt.Fprint(w, `likewind — which flight conditions can a ground facility reproduce?

usage:
  likewind                                   open the interface on the embedded demo
  likewind VEHICLE.toml FACILITIES.toml...   open the interface on your own files
  likewind point --alt H --mach M [--length L] [--dt DT] [--json]
                                             every flight quantity at one condition
  likewind check FILE...                     validate vehicle and facility files
  likewind dump [FILES] [-o FILE]            the matrix as text for reports
  likewind export [FILES] --format csv|json  every grid point's numbers
  likewind plot [FILES] -o FILE.png|FILE.svg pictures for slides
  likewind coverage [FILES]                  coverage shares per facility
  likewind scales [FILES]                    coverage by model scale per facility
  likewind runs [FILES]                      run list in facility order
  likewind report [FILES] -o FILE.html       one review pack page for print
  likewind serve [FILES] [--listen ADDR] [--authorized-keys FILE] [--session FILE]
                                             a shared design review over SSH
  likewind version

Values carry their units: 35000ft, 11km, 250kt, 0.8 (Mach), 3bar, 45psi, -56.5degC.

Results are planning estimates. Pressure vessels, cryogenic nitrogen and loaded
models need the facility's own procedures, local codes and licensed engineering
practice.
`)
	return err
}
