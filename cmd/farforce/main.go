// Command farforce computes the force on a body from a CFD solution by
// integrating the steady momentum balance over closed control surfaces cut
// through the mesh. Run "farforce help" for the commands.
package main

import "os"

func main() {
	os.Exit(run(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}
