package outfile

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// bufSize is the buffer of each output's writer, in bytes: large, for
// files of samples that run to hundreds of megabytes; stdoutBufSize is
// that of standard output, which gets reports of a few kilobytes and
// should not cost a run a megabyte of fresh memory.
const (
	bufSize       = 1 << 20
	stdoutBufSize = 64 << 10
)

// Modes of new files and folders, set whatever the umask.
const (
	newFileMode   fs.FileMode = 0o644
	newFolderMode fs.FileMode = 0o755
)

var errStopped = errors.New("the run was stopped, and its outputs were taken back")

// Write writes t's content: fn receives a buffered writer. A file is
// written at once to a temporary file beside it, which Commit renames
// into place; if fn or the writing fails, the error names the output and
// the whole set is taken back, as by Abort, so that Commit refuses. For standard output
// and a device or FIFO, fn is kept and called by Commit. Write is called
// once for each target.
func (t *Target) Write(fn func(io.Writer) error) error {
	s := t.set
	s.mu.Lock()
	if t.written {
		s.mu.Unlock()
		panic("outfile: " + t.flag + " " + t.spelled + " written twice")
	}
	if s.state != open {
		s.mu.Unlock()
		return errStopped
	}
	t.written = true
	if t.stdout || t.direct() {
		t.write = fn
		s.mu.Unlock()
		return nil
	}
	f, err := s.createTemp(t)
	s.mu.Unlock()
	if err != nil {
		return errors.Join(t.fail(err), s.Abort())
	}
	if err := fill(f, t.mode(), fn); err != nil {
		// Abort removes the temporary file with the rest: a set with a
		// failed output commits nothing.
		return errors.Join(t.fail(err), s.Abort())
	}
	return nil
}

// fill writes fn's content to f, gives f its mode, and closes it.
func fill(f *os.File, mode fs.FileMode, fn func(io.Writer) error) error {
	bw := bufio.NewWriterSize(f, bufSize)
	err := fn(bw)
	if err == nil {
		err = bw.Flush()
	}
	if err == nil {
		err = f.Chmod(mode)
	}
	if err == nil {
		err = f.Sync()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	return err
}

// mode is the mode t's file gets: that of the file it replaces, or
// newFileMode.
func (t *Target) mode() fs.FileMode {
	if t.info != nil {
		return t.info.Mode().Perm()
	}
	return newFileMode
}

func (t *Target) fail(err error) error {
	return fmt.Errorf("writing %s %s: %w", t.flag, t.spelled, err)
}

// createTemp creates t's temporary file, and t's folder first if this
// run is to create it. s.mu is held.
func (s *Set) createTemp(t *Target) (*os.File, error) {
	if f := t.folder; t.inNewFolder() {
		if err := os.Mkdir(f.path, newFolderMode); err != nil {
			return nil, err
		}
		f.created = true
		if err := os.Chmod(f.path, newFolderMode); err != nil {
			return nil, err
		}
	}
	f, err := os.CreateTemp(filepath.Dir(t.path), "."+filepath.Base(t.path)+".tmp-*")
	if err != nil {
		return nil, err
	}
	t.tmp = f.Name()
	return f, nil
}

// Commit puts every output in place, once each has been written: it
// writes standard output and any device or FIFO (opening a FIFO waits
// for its reader), then renames every temporary file over its target.
// If one fails, it takes back what it did, as Abort, and returns the
// error. A Set is committed once; Commit after Abort returns an error.
func (s *Set) Commit() error {
	s.mu.Lock()
	if s.state != open {
		s.mu.Unlock()
		return errStopped
	}
	targets := append([]*Target(nil), s.targets...)
	for _, t := range targets {
		if !t.written {
			s.mu.Unlock()
			panic("outfile: Commit before " + t.flag + " " + t.spelled + " was written")
		}
	}
	s.mu.Unlock()
	for _, t := range targets {
		if t.write == nil {
			continue
		}
		if err := s.writeDirect(t); err != nil {
			return errors.Join(err, s.Abort())
		}
	}

	s.mu.Lock()
	defer s.mu.Unlock()
	if s.state != open {
		return errStopped
	}
	for _, t := range targets {
		if t.tmp == "" {
			continue
		}
		if err := t.rename(); err != nil {
			s.state = aborted
			return errors.Join(fmt.Errorf("putting %s %s in place: %w", t.flag, t.spelled, err), s.undo())
		}
	}
	s.state = committed
	var errs []error
	for _, t := range targets {
		if t.backup != "" {
			if err := os.Remove(t.backup); err != nil {
				errs = append(errs, fmt.Errorf("%s %s is written, but its old copy %s could not be removed: %w", t.flag, t.spelled, t.backup, err))
			}
			t.backup = ""
		}
	}
	return errors.Join(errs...)
}

// writeDirect writes standard output, a device or a FIFO.
func (s *Set) writeDirect(t *Target) error {
	w, size := s.stdout, stdoutBufSize
	var f *os.File
	if !t.stdout {
		var err error
		if f, err = os.OpenFile(t.path, os.O_WRONLY, 0); err != nil {
			return t.fail(err)
		}
		w, size = f, bufSize
	}
	bw := bufio.NewWriterSize(w, size)
	err := t.write(bw)
	if err == nil {
		err = bw.Flush()
	}
	if f != nil {
		if cerr := f.Close(); err == nil {
			err = cerr
		}
	}
	if err != nil {
		return t.fail(err)
	}
	return nil
}

// rename puts t's temporary file in place, keeping a hard link to the
// file it replaces (or, where hard links fail, the file itself, renamed)
// so that it can be restored. s.mu is held.
func (t *Target) rename() error {
	if t.info != nil {
		b, err := os.CreateTemp(filepath.Dir(t.path), "."+filepath.Base(t.path)+".old-*")
		if err != nil {
			return err
		}
		b.Close()
		os.Remove(b.Name())
		if err := os.Link(t.path, b.Name()); err != nil {
			if err := os.Rename(t.path, b.Name()); err != nil {
				return err
			}
		}
		t.backup = b.Name()
	}
	if err := os.Rename(t.tmp, t.path); err != nil {
		t.restore()
		return err
	}
	t.tmp, t.placed = "", true
	return nil
}

// restore puts back the file t replaced. s.mu is held.
func (t *Target) restore() error {
	if t.backup == "" {
		return nil
	}
	if err := os.Rename(t.backup, t.path); err != nil {
		return fmt.Errorf("restoring %s %s: its old content is in %s: %w", t.flag, t.spelled, t.backup, err)
	}
	// Renaming a hard link over another link to the same file does
	// nothing; the backup is then still there.
	os.Remove(t.backup)
	t.backup = ""
	return nil
}

// Abort takes back everything s did: it removes the temporary files,
// removes the new files Commit had put in place and restores the ones it
// had replaced, and removes a folder this run created (if it is empty).
// It may be called at any time from any goroutine, e.g. on an interrupt,
// and more than once; after Commit it does nothing. The error lists what
// could not be taken back.
func (s *Set) Abort() error {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.state != open {
		return nil
	}
	s.state = aborted
	return s.undo()
}

// undo takes back s's files. s.mu is held.
func (s *Set) undo() error {
	var errs []error
	for i := len(s.targets) - 1; i >= 0; i-- {
		t := s.targets[i]
		if t.tmp != "" {
			if err := os.Remove(t.tmp); err != nil && !errors.Is(err, fs.ErrNotExist) {
				errs = append(errs, err)
			}
			t.tmp = ""
		}
		if !t.placed {
			continue
		}
		t.placed = false
		if t.backup != "" {
			errs = append(errs, t.restore())
		} else if err := os.Remove(t.path); err != nil {
			errs = append(errs, fmt.Errorf("removing %s %s: %w", t.flag, t.spelled, err))
		}
	}
	for _, f := range s.folders {
		if f.created {
			if err := os.Remove(f.path); err != nil {
				errs = append(errs, fmt.Errorf("removing the folder %s %s: %w", f.flag, f.spelled, err))
			}
			f.created = false
		}
	}
	return errors.Join(errs...)
}

// WriteFile writes one file by the rules of a Set: checked, written to a
// temporary file beside it and renamed into place only when write
// succeeds. flag names the file in messages (e.g. "--junit").
func WriteFile(flag, path string, write func(io.Writer) error) error {
	s := New(io.Discard)
	t, err := s.Add(flag, path)
	if err != nil {
		return err
	}
	if err := t.Write(write); err != nil {
		s.Abort()
		return err
	}
	return s.Commit()
}
