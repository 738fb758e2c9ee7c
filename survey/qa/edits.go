package qa

import (
	"path/filepath"

	"isofield/survey/fileout"
)

// editPlan is the hand edits resolved to readings, in order.
type editPlan struct {
	reading []int // reading index per applied edit
	edits   []Edit
}

// resolveEdits finds the reading each edit names and marks readings that
// end up excluded by hand, so that the checks leave them out. Edits that
// name no reading are ignored with a remark.
func (c *checker) resolveEdits(edits []Edit) editPlan {
	var plan editPlan
	if len(edits) == 0 {
		return plan
	}
	byLine := map[[2]int]int{}
	for i, rd := range c.s.Readings {
		byLine[[2]int{rd.File, rd.Line0}] = i
	}
	fileOf := map[string]int{}
	for _, e := range edits {
		fi, ok := fileOf[e.File]
		if !ok {
			fi = c.fileIndex(e.File)
			fileOf[e.File] = fi
		}
		i, found := byLine[[2]int{fi, e.Line}]
		switch {
		case fi < 0 || !found:
			c.remark("hand edit of %s:%d (%s) matches no reading: ignored (was the file changed?)", e.File, e.Line, e.ID)
			continue
		case e.ID != "" && c.s.Readings[i].ID != e.ID:
			c.remark("hand edit of %s:%d names id %q but the line holds %q: ignored (was the file changed?)",
				e.File, e.Line, e.ID, c.s.Readings[i].ID)
			continue
		}
		plan.reading = append(plan.reading, i)
		plan.edits = append(plan.edits, e)
		c.hand[i] = e.Exclude
	}
	return plan
}

// fileIndex returns the index of the survey file that path names, or −1.
func (c *checker) fileIndex(path string) int {
	for fi, f := range c.s.Files {
		if f.Path == path || filepath.Clean(f.Path) == filepath.Clean(path) {
			return fi
		}
	}
	for fi, f := range c.s.Files {
		if fileout.SameFile(f.Path, path) {
			return fi
		}
	}
	return -1
}

// applyEdits applies the hand edits last: an exclusion makes the reading
// excluded whatever its status; an inclusion makes it ok, whatever the
// checks said (the user vouches for it, as for a real anomaly the spike
// check doubted).
func (c *checker) applyEdits(plan editPlan) {
	for k, i := range plan.reading {
		e := plan.edits[k]
		if e.Exclude {
			c.setStatus(i, Excluded, KindExclude, "excluded by hand: "+reasonOr(e.Reason))
			continue
		}
		c.setStatus(i, OK, KindInclude, "included by hand: "+reasonOr(e.Reason))
	}
}

func reasonOr(r string) string {
	if r == "" {
		return "no reason given"
	}
	return r
}
