// Package outfile writes the output files of one run all or nothing, and
// refuses, before the run starts, any output that would destroy a file the
// user cares about.
//
// A Set is built from the run's inputs; each output is added to it (Add
// for a file or standard output, AddFolder for a folder of charts), and
// every path is checked at once: an output may not be an input, two
// outputs may not share a file (except the null device, os.DevNull,
// which keeps nothing), a read-only file (no write bit in its
// mode, whoever runs, root included) is refused, a folder is not a file,
// and the folder a new file goes into must exist and be writable. Paths
// are compared by where they lead (symbolic links followed) and, for
// files that exist, by device and inode, so hard links and other
// spellings of a path are caught too.
//
// Then each output is written (Target.Write) and the Set is committed.
// A regular file is written to a hidden temporary file beside it
// (.NAME.tmp-*), and Commit renames every temporary file into place only
// when all outputs have been written; if one fails, the temporary files
// are removed and any file already put in place is taken back (a new file
// removed, a replaced one restored). Abort does the same from any
// goroutine, e.g. on an interrupt. A replaced file keeps its mode bits; a
// new file gets mode 0644 and a new folder 0755, whatever the umask.
//
// A symbolic link is written through: the link stays and the file it
// leads to gets the new content, under the same rules. Standard output
// ("-") and an existing file that is not a regular file (a character
// device such as /dev/null, a FIFO) are written directly, without a
// temporary file, by Commit before any file is renamed into place: what
// is written there cannot be taken back.
//
// outfile relies on POSIX file semantics (rename, hard links, access(2)).
package outfile
