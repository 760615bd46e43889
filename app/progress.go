package app

import (
	"io"
	"os"
	"time"

	"github.com/schollz/progressbar/v3"
	"golang.org/x/term"
)

// progress shows a bar on stderr for long runs, only when stderr is a
// terminal; a nil *progress does nothing.
type progress struct {
	w     io.Writer
	start time.Time
	bar   *progressbar.ProgressBar
}

func newProgress(w io.Writer) *progress {
	f, ok := w.(*os.File)
	if !ok || !term.IsTerminal(int(f.Fd())) {
		return nil
	}
	return &progress{w: w, start: time.Now()}
}

// update is the simulate.Options.Progress callback. The bar appears once
// the run has taken more than a second.
func (p *progress) update(done, total int) {
	if p == nil {
		return
	}
	if p.bar == nil {
		if time.Since(p.start) < time.Second {
			return
		}
		p.bar = progressbar.NewOptions(total,
			progressbar.OptionSetWriter(p.w),
			progressbar.OptionSetDescription("simulating"),
			progressbar.OptionClearOnFinish(),
			progressbar.OptionThrottle(100*time.Millisecond))
	}
	_ = p.bar.Set(done)
}

func (p *progress) finish() {
	if p == nil || p.bar == nil {
		return
	}
	_ = p.bar.Finish()
}
