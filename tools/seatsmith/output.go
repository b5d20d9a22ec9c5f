package main

import (
	"bufio"
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
)

// outputFlags choose the output format and destination. A file is replaced
// only once the new content is complete, so a failure never leaves half a
// result: output goes to a temporary file beside it, renamed over it at
// the end.
type outputFlags struct {
	format string
	out    string
}

func (o *outputFlags) bind(fs *flag.FlagSet, formats ...string) {
	fs.StringVar(&o.format, "format", formats[0], "output format: "+strings.Join(formats, ", "))
	fs.StringVar(&o.out, "o", "", "write the output to this file instead of standard output")
}

func (o *outputFlags) check(formats ...string) error {
	for _, f := range formats {
		if o.format == f {
			return nil
		}
	}
	return usageError("-format: unknown format " + quote(o.format) + "; use " + strings.Join(formats, ", "))
}

// write delivers the finished output.
func (o *outputFlags) write(e *env, b *bytes.Buffer) error {
	if o.out == "" || o.out == "-" {
		_, err := e.stdout.Write(b.Bytes())
		return err
	}
	dir := filepath.Dir(o.out)
	tmp, err := os.CreateTemp(dir, ".seatsmith-*")
	if err != nil {
		return err
	}
	name := tmp.Name()
	if _, err := tmp.Write(b.Bytes()); err != nil {
		tmp.Close()
		os.Remove(name)
		return err
	}
	if err := tmp.Close(); err != nil {
		os.Remove(name)
		return err
	}
	if err := os.Rename(name, o.out); err != nil {
		os.Remove(name)
		return err
	}
	return nil
}

// stream calls fill with a buffered writer and delivers what it writes:
// straight to standard output, or through a temporary file renamed over
// the destination once fill and every write have succeeded. Nothing is
// held in memory beyond the buffer.
func (o *outputFlags) stream(e *env, fill func(w *bufio.Writer) error) error {
	if o.out == "" || o.out == "-" {
		w := bufio.NewWriterSize(e.stdout, 1<<16)
		if err := fill(w); err != nil {
			w.Flush()
			return err
		}
		return w.Flush()
	}
	tmp, err := os.CreateTemp(filepath.Dir(o.out), ".seatsmith-*")
	if err != nil {
		return err
	}
	name := tmp.Name()
	w := bufio.NewWriterSize(tmp, 1<<16)
	err = fill(w)
	if err == nil {
		err = w.Flush()
	}
	if cerr := tmp.Close(); err == nil {
		err = cerr
	}
	if err == nil {
		err = os.Rename(name, o.out)
	}
	if err != nil {
		os.Remove(name)
	}
	return err
}
