package main

import (
	"bufio"
	"crypto/rand"
	"encoding/hex"
	"errors"
	"flag"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"sync"

	"seatsmith/engine/format"
	"seatsmith/engine/format/csv"
	"seatsmith/engine/format/json"
	"seatsmith/engine/format/markdown"
	"seatsmith/engine/format/svg"
	"seatsmith/engine/format/text"
)

// outputFlags choose the output format and destination. A file is replaced
// only once the new content is complete and on disk, so a failure, or an
// interrupt, never leaves half a result or a stray temporary file: output
// goes to a temporary file beside the destination, which is synced and
// renamed over it at the end (keeping the replaced file's permissions), and
// removed if the run fails or is stopped by a signal.
type outputFlags struct {
	format string
	out    string
}

func (o *outputFlags) bind(fs *flag.FlagSet, formats ...string) {
	fs.StringVar(&o.format, "format", formats[0], "output format: "+strings.Join(formats, ", "))
	fs.StringVar(&o.out, "o", "", "write the output to this file instead of standard output")
}

// check checks the format and that -o names a file that can be written in
// a folder that exists, before any work is done.
func (o *outputFlags) check(formats ...string) error {
	known := false
	for _, f := range formats {
		known = known || o.format == f
	}
	if !known {
		return usageError("-format: unknown format " + quote(o.format) + "; use " + strings.Join(formats, ", "))
	}
	if o.out == "" || o.out == "-" {
		return nil
	}
	if st, err := os.Stat(o.out); err == nil && st.IsDir() {
		return usageError("-o: " + o.out + " is a folder; name the file to write, such as " + filepath.Join(o.out, "result."+extension(o.format)))
	}
	dir := filepath.Dir(o.out)
	st, err := os.Stat(dir)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return usageError("-o: the folder " + dir + " does not exist")
	case err != nil:
		return usageError("-o: cannot use the folder " + dir + ": " + pathErrText(err))
	case !st.IsDir():
		return usageError("-o: " + dir + " is not a folder")
	}
	return nil
}

func extension(format string) string {
	switch format {
	case "text":
		return "txt"
	case "markdown":
		return "md"
	}
	return format
}

// encoders are the formats' encoders, by name.
var encoders = map[string]format.Encoder{
	"text": text.Encoder{}, "markdown": markdown.Encoder{}, "csv": csv.Encoder{}, "json": json.Encoder{}, "svg": svg.Encoder{},
}

// encode writes d in the chosen format, as it is made.
func (o *outputFlags) encode(e *env, d *format.Document) error {
	enc := encoders[o.format]
	return o.stream(e, func(w *bufio.Writer) error { return enc.Encode(w, d) })
}

// stream calls fill with a buffered writer and delivers what it writes:
// straight to standard output, or into a file replaced only once fill and
// every write have succeeded. Nothing is held in memory beyond the buffer.
func (o *outputFlags) stream(e *env, fill func(w *bufio.Writer) error) error {
	if o.out == "" || o.out == "-" {
		w := bufio.NewWriterSize(e.stdout, 1<<16)
		if err := fill(w); err != nil {
			w.Flush()
			return err
		}
		return w.Flush()
	}
	f, err := createBeside(o.out)
	if err != nil {
		return err
	}
	w := bufio.NewWriterSize(f.file, 1<<16)
	err = fill(w)
	if err == nil {
		err = w.Flush()
	}
	if err != nil {
		f.abort()
		return err
	}
	return f.commit()
}

// An atomicFile is a temporary file that becomes dst when committed.
type atomicFile struct {
	file *os.File
	tmp  string
	dst  string // the file replaced: the destination, or where its link points
}

// Temporary files in the making, removed by [removeTemporaries] when a
// signal stops the program.
var temporaries struct {
	sync.Mutex
	names map[string]bool
}

// createBeside creates a temporary file in the folder of dst (so that the
// rename at the end stays on one file system), with dst's permissions when
// it exists and the usual ones for a new file otherwise.
func createBeside(dst string) (*atomicFile, error) {
	if real, err := filepath.EvalSymlinks(dst); err == nil {
		dst = real // replace the file a link points to, not the link
	}
	perm, keep := fs.FileMode(0o666), false // the umask applies to a new file
	if st, err := os.Stat(dst); err == nil {
		if !st.Mode().IsRegular() {
			return nil, errors.New("-o: " + dst + " is not a regular file")
		}
		perm, keep = st.Mode().Perm(), true
	}
	var rnd [6]byte
	rand.Read(rnd[:])
	tmp := filepath.Join(filepath.Dir(dst), ".seatsmith-"+filepath.Base(dst)+"-"+hex.EncodeToString(rnd[:])+".tmp")
	temporaries.Lock()
	defer temporaries.Unlock()
	f, err := os.OpenFile(tmp, os.O_WRONLY|os.O_CREATE|os.O_EXCL, perm)
	if err != nil {
		return nil, errors.New("-o: cannot write in the folder of " + dst + ": " + pathErrText(err))
	}
	if keep {
		f.Chmod(perm) // the umask may have taken bits the old file had
	}
	if temporaries.names == nil {
		temporaries.names = map[string]bool{}
	}
	temporaries.names[tmp] = true
	return &atomicFile{file: f, tmp: tmp, dst: dst}, nil
}

// commit syncs the file to disk and renames it over the destination.
func (a *atomicFile) commit() error {
	err := a.file.Sync()
	if cerr := a.file.Close(); err == nil {
		err = cerr
	}
	temporaries.Lock()
	defer temporaries.Unlock()
	if err == nil {
		err = os.Rename(a.tmp, a.dst)
	}
	delete(temporaries.names, a.tmp)
	if err != nil {
		os.Remove(a.tmp)
		return errors.New("-o: cannot write " + a.dst + ": " + pathErrText(err))
	}
	// The rename is durable once the folder is synced too; not every
	// system can sync a folder, and the file is in place either way.
	if d, err := os.Open(filepath.Dir(a.dst)); err == nil {
		d.Sync()
		d.Close()
	}
	return nil
}

// abort removes the temporary file.
func (a *atomicFile) abort() {
	a.file.Close()
	temporaries.Lock()
	defer temporaries.Unlock()
	os.Remove(a.tmp)
	delete(temporaries.names, a.tmp)
}

// removeTemporaries removes every temporary file in the making and keeps
// any more from being made or renamed: it returns holding the lock, for a
// program about to exit.
func removeTemporaries() {
	temporaries.Lock()
	for name := range temporaries.names {
		os.Remove(name)
	}
	temporaries.names = nil
}

// pathErrText is an error's text without the path an *fs.PathError or
// *os.LinkError repeats.
func pathErrText(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err.Error()
	}
	return err.Error()
}
