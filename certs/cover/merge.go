package cover

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io/fs"
	"math/big"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"gapcert/certs/outfile"
	"gapcert/certs/sweep"
	"gapcert/fem/problem"
)

// Kinds of tiling and merge issues.
const (
	IssueFamily   = "family"    // the directories hold different or no family files
	IssueTampered = "tampered"  // a cell certificate that does not verify
	IssueOutside  = "outside"   // a cell that does not lie in one box of the first split
	IssueOverlap  = "overlap"   // cells whose interiors meet
	IssueGap      = "uncovered" // a part of the box that no cell covers
	IssueNotLeaf  = "not_leaf"  // a cell that is not a leaf of the bisection tree
	IssueDup      = "duplicate" // the same cell twice
)

// TileIssue is one defect of a set of cells as a tiling of the box.
type TileIssue struct {
	Kind string
	Msg  string
}

func (is TileIssue) String() string { return is.Kind + ": " + is.Msg }

// MergeError lists every defect found by Merge; nothing was written.
type MergeError struct {
	Issues []TileIssue
}

func (e *MergeError) Error() string {
	lines := []string{fmt.Sprintf("the cover outputs do not tile the family's box (%d issues):", len(e.Issues))}
	for _, is := range e.Issues {
		lines = append(lines, "  - "+is.String())
	}
	return strings.Join(lines, "\n")
}

// Tile proves that the cells tile the family's box, or lists why not. It
// matches the cells to the leaves of the bisection trees of the roots
// (package documentation, "Tiling"): each cell is assigned to the root
// that contains it (exact comparisons; a cell in no root is "outside"),
// and in each box of the tree, from the root down, the cells inside it
// are either exactly one cell equal to the box (a leaf), or none (a
// "gap": the box is uncovered), or cells inside its two halves (the box
// was bisected at the family's split parameter; a cell crossing the
// midpoint is "not_leaf", and the cells whose interiors it meets are
// named as "overlap"). A cell equal to a box that holds other cells
// overlaps them. An empty result proves that the cells, pairwise
// interior-disjoint, cover the box.
func (f *Family) Tile(cells []Box) []TileIssue {
	var issues []TileIssue
	names := f.ParamNames()
	seen := map[string]bool{}
	roots := f.Roots()
	byRoot := make([][]Box, len(roots))
	for _, c := range cells {
		if seen[c.key()] {
			issues = append(issues, TileIssue{IssueDup, fmt.Sprintf("the cell %s is given twice", c.Text(names))})
			continue
		}
		seen[c.key()] = true
		placed := false
		for k, r := range roots {
			if c.Inside(r) {
				byRoot[k] = append(byRoot[k], c)
				placed = true
				break
			}
		}
		if !placed {
			issues = append(issues, TileIssue{IssueOutside, fmt.Sprintf("the cell %s lies in no box of the first split (it crosses one of their faces or leaves the box)", c.Text(names))})
		}
	}
	for k, r := range roots {
		issues = append(issues, f.tileBox(r, byRoot[k], names)...)
	}
	return issues
}

func (f *Family) tileBox(b Box, cells []Box, names []string) []TileIssue {
	if len(cells) == 0 {
		return []TileIssue{{IssueGap, fmt.Sprintf("no cell covers %s", b.Text(names))}}
	}
	for _, c := range cells {
		if c.Equal(b) {
			if len(cells) == 1 {
				return nil
			}
			var others []string
			for _, o := range cells {
				if !o.Equal(b) {
					others = append(others, o.Text(names))
				}
			}
			return []TileIssue{{IssueOverlap, fmt.Sprintf("the cell %s overlaps %s", b.Text(names), strings.Join(others, "; "))}}
		}
	}
	j := f.splitParam(b)
	if j < 0 {
		var texts []string
		for _, c := range cells {
			texts = append(texts, c.Text(names))
		}
		return []TileIssue{{IssueNotLeaf, fmt.Sprintf("%s is a smallest cell, but the cells inside it are not it: %s", b.Text(names), strings.Join(texts, "; "))}}
	}
	lower, upper := b.bisect(j)
	var inLower, inUpper []Box
	var issues []TileIssue
	for _, c := range cells {
		switch {
		case c.Inside(lower):
			inLower = append(inLower, c)
		case c.Inside(upper):
			inUpper = append(inUpper, c)
		default:
			msg := fmt.Sprintf("the cell %s crosses the bisection of %s at %s = %s", c.Text(names), b.Text(names), names[j], problem.RatText(lower.Hi[j]))
			var meets []string
			for _, o := range cells {
				if o.key() != c.key() && interiorsMeet(c, o) {
					meets = append(meets, o.Text(names))
				}
			}
			issues = append(issues, TileIssue{IssueNotLeaf, msg})
			if len(meets) > 0 {
				issues = append(issues, TileIssue{IssueOverlap, fmt.Sprintf("the cell %s overlaps %s", c.Text(names), strings.Join(meets, "; "))})
			}
		}
	}
	if len(issues) > 0 {
		return issues
	}
	return append(f.tileBox(lower, inLower, names), f.tileBox(upper, inUpper, names)...)
}

// interiorsMeet reports whether the open boxes meet (exact comparisons).
func interiorsMeet(a, b Box) bool {
	for j := range a.Lo {
		if a.Hi[j].Cmp(b.Lo[j]) <= 0 || b.Hi[j].Cmp(a.Lo[j]) <= 0 {
			return false
		}
	}
	return true
}

// MergeOptions are the options of Merge: Progress receives a line per
// cell certificate verified or rebuilt (nil: none), Memory is the memory
// budget of each recomputation of a corner certificate
// (certify.CheckWithin; 0: certify.DefaultMemory).
type MergeOptions struct {
	Progress func(format string, args ...any)
	Memory   int64
}

// Merge gathers the cell certificates of the cover directories dirs (the
// outputs of Run, in any split into shards), verifies each (CheckCell,
// with the corner files of its own directory), proves that the cells tile
// the family's box (Tile), and makes outDir a cover directory of the
// whole box that stands alone: the family file, every cell certificate
// and the corner certificates they name copied into it, and the merged
// summary (summary.json, summary.csv, summary-cells.csv; they must not
// exist), whose Tiling records the proof. Any defect — different family
// files, a certificate that does not verify, cells that overlap, leave a
// gap, or are not leaves of the bisection trees — is listed in a
// *MergeError and nothing is written. outDir may be one of dirs.
func Merge(dirs []string, outDir string, opt MergeOptions) (*Summary, error) {
	progress := opt.Progress
	if len(dirs) == 0 {
		return nil, errors.New("no cover directories to merge")
	}
	var famData []byte
	var issues []TileIssue
	for _, dir := range dirs {
		d, err := os.ReadFile(filepath.Join(dir, FamilyFileName))
		if err != nil {
			issues = append(issues, TileIssue{IssueFamily, fmt.Sprintf("%s: %v; is %s a cover directory?", filepath.Join(dir, FamilyFileName), err, dir)})
			continue
		}
		if famData == nil {
			famData = d
		} else if !bytes.Equal(d, famData) {
			issues = append(issues, TileIssue{IssueFamily, fmt.Sprintf("%s differs from %s: the directories hold different families", filepath.Join(dir, FamilyFileName), filepath.Join(dirs[0], FamilyFileName))})
		}
	}
	if len(issues) > 0 {
		return nil, &MergeError{Issues: issues}
	}
	f, err := ParseFamily(famData)
	if err != nil {
		return nil, err
	}
	type found struct {
		dir, name string
		data      []byte
		cell      *Cell
		box       Box
	}
	var cells []found
	verifier := NewCornerVerifier(opt.Memory)
	famName := FamilyFileName
	for _, dir := range dirs {
		entries, err := os.ReadDir(dir)
		if err != nil {
			return nil, err
		}
		for _, e := range entries {
			if e.IsDir() {
				continue
			}
			if strings.HasPrefix(e.Name(), "summary") && strings.HasSuffix(e.Name(), ".json") {
				if data, err := os.ReadFile(filepath.Join(dir, e.Name())); err == nil {
					if s, err := UnmarshalSummary(data); err == nil && s.FamilySHA256 == f.SHA256 && s.Family != "" {
						famName = s.Family
					}
				}
			}
			if !strings.HasSuffix(e.Name(), cellSuffix) {
				continue
			}
			path := filepath.Join(dir, e.Name())
			data, err := os.ReadFile(path)
			if err != nil {
				return nil, err
			}
			c, cf, err := CheckCell(data, dir, verifier)
			switch {
			case err != nil:
				issues = append(issues, TileIssue{IssueTampered, fmt.Sprintf("%s: %s", path, oneLine(err))})
				continue
			case cf.SHA256 != f.SHA256:
				issues = append(issues, TileIssue{IssueFamily, fmt.Sprintf("%s is a cell of another family", path)})
				continue
			}
			b := mustBox(c, f)
			if e.Name() != CellFileName(b) {
				issues = append(issues, TileIssue{IssueTampered, fmt.Sprintf("%s: the name of the cell %s is %s", path, b.Text(f.ParamNames()), CellFileName(b))})
				continue
			}
			if progress != nil {
				progress("%s: verifies\n", path)
			}
			cells = append(cells, found{dir: dir, name: e.Name(), data: data, cell: c, box: b})
		}
	}
	var boxes []Box
	for _, c := range cells {
		boxes = append(boxes, c.box)
	}
	issues = append(issues, f.Tile(boxes)...)
	if len(issues) > 0 {
		sort.SliceStable(issues, func(i, j int) bool { return issues[i].Kind < issues[j].Kind })
		return nil, &MergeError{Issues: issues}
	}
	total := new(big.Rat)
	for _, b := range boxes {
		total.Add(total, b.Measure())
	}
	if total.Cmp(f.Box().Measure()) != 0 {
		return nil, fmt.Errorf("internal: the cells tile the box but their measures sum to %s, not %s", total.RatString(), f.Box().Measure().RatString())
	}
	// Copies: family, corners, cells (summary last).
	type fileCopy struct {
		to   string
		data []byte
	}
	var copies []fileCopy
	add := func(name string, data []byte) error {
		to := filepath.Join(outDir, name)
		old, err := os.ReadFile(to)
		switch {
		case errors.Is(err, fs.ErrNotExist):
			copies = append(copies, fileCopy{to, data})
		case err != nil:
			return err
		case !bytes.Equal(old, data):
			return fmt.Errorf("%s exists and differs from the merged file of that name; not overwritten (choose another output directory)", to)
		}
		return nil
	}
	if err := add(FamilyFileName, famData); err != nil {
		return nil, err
	}
	// One certificate per corner file name: shards certify the corners
	// they share each on their own, so the same corner problem may come
	// with certificates that differ in bytes (their provenance, at
	// least). The version already in outDir is kept when a cell uses it,
	// else the first met; a cell that names another version is rebuilt on
	// the kept one (buildCell, as CheckCell recomputes it), so that every
	// cell in outDir verifies with the corner files beside it.
	kept := map[string]cornerVersion{}
	for _, c := range cells {
		for _, ref := range []CornerRef{c.cell.Low, c.cell.High} {
			if _, ok := kept[ref.File]; ok {
				continue
			}
			if data, err := os.ReadFile(filepath.Join(outDir, ref.File)); err == nil && sha256Hex(data) == ref.CertificateSHA256 {
				kept[ref.File] = cornerVersion{dir: outDir, sha: ref.CertificateSHA256}
			}
		}
	}
	for _, c := range cells {
		for _, ref := range []CornerRef{c.cell.Low, c.cell.High} {
			if _, ok := kept[ref.File]; !ok {
				kept[ref.File] = cornerVersion{dir: c.dir, sha: ref.CertificateSHA256}
			}
		}
	}
	corners := map[string]bool{}
	var rows []CellRow
	for _, c := range cells {
		for _, ref := range []CornerRef{c.cell.Low, c.cell.High} {
			if corners[ref.File] {
				continue
			}
			corners[ref.File] = true
			k := kept[ref.File]
			data, err := os.ReadFile(filepath.Join(k.dir, ref.File))
			if err != nil {
				return nil, err
			}
			if sha256Hex(data) != k.sha {
				return nil, fmt.Errorf("%s changed after it was verified; nothing merged (run the merge again)", filepath.Join(k.dir, ref.File))
			}
			if err := add(ref.File, data); err != nil {
				return nil, err
			}
		}
		if kept[c.cell.Low.File].sha != c.cell.Low.CertificateSHA256 || kept[c.cell.High.File].sha != c.cell.High.CertificateSHA256 {
			rebuilt, err := f.rebuildOnCorners(c.cell, c.box, kept[c.cell.Low.File].sha, kept[c.cell.High.File].sha, verifier)
			if err != nil {
				return nil, fmt.Errorf("%s: %v", filepath.Join(c.dir, c.name), err)
			}
			data, err := rebuilt.Marshal()
			if err != nil {
				return nil, err
			}
			c.cell, c.data = rebuilt, data
			if progress != nil {
				progress("%s: rebuilt on the corner certificates kept in the merge\n", filepath.Join(c.dir, c.name))
			}
		}
		if err := add(c.name, c.data); err != nil {
			return nil, err
		}
		row := CellRow{Bounds: c.cell.Bounds, File: c.name, Status: StatusVerified, Measure: f.fraction(c.box.Measure())}
		fillRow(&row, c.cell, c.data)
		rows = append(rows, row)
	}
	base := summaryName(sweep.Shard{Index: 0, Count: 1})
	for _, ext := range []string{".json", ".csv", "-cells.csv"} {
		if _, err := os.Lstat(filepath.Join(outDir, base+ext)); !errors.Is(err, fs.ErrNotExist) {
			return nil, fmt.Errorf("%s exists; not overwritten (choose another output directory)", filepath.Join(outDir, base+ext))
		}
	}
	if err := os.MkdirAll(outDir, 0o755); err != nil {
		return nil, err
	}
	for _, c := range copies {
		if err := outfile.WriteNew(c.to, c.data); err != nil {
			return nil, err
		}
	}
	s := f.summarize(famName, sweep.Shard{Index: 0, Count: 1}, rows, len(corners))
	s.Tiling = fmt.Sprintf("proved: the %d cells are exactly the leaves of the bisection trees of the %d boxes of the first split (exact rational bounds); their measures sum to the box's", len(rows), len(f.Roots()))
	if err := writeSummary(outDir, base, s); err != nil {
		return nil, err
	}
	return s, nil
}

// cornerVersion is the corner certificate a merge keeps for one file
// name: the directory it is copied from and its SHA-256.
type cornerVersion struct {
	dir, sha string
}

// rebuildOnCorners returns the certificate of the cell c (box b) built on
// the corner certificates with SHA-256 lowSHA and highSHA, both verified
// by v already (each is the version another cell of the merge names):
// the cell's quantities, claims and verdict are recomputed from them
// (buildCell), its provenance kept.
func (f *Family) rebuildOnCorners(c *Cell, b Box, lowSHA, highSHA string, v *CornerVerifier) (*Cell, error) {
	lv, hv := f.Corners(b)
	var cs [2]corner
	for i, vals := range [][]*big.Rat{lv, hv} {
		p, err := f.Problem(vals)
		if err != nil {
			return nil, err
		}
		cert, ok := v.verified[[2]string{lowSHA, highSHA}[i]]
		if !ok || cert.ProblemSHA256 != p.SHA256() {
			return nil, fmt.Errorf("internal: the kept corner certificate of %s was not verified", f.describe(vals))
		}
		cs[i] = corner{problem: p, cert: cert}
	}
	return f.buildCell(b, cs[0], cs[1], lowSHA, highSHA, c.Provenance)
}

// IsCoverDir reports whether dir holds the family file of a cover (a
// family.json that reads as a cover family), so that a command shared with
// sweeps can dispatch.
func IsCoverDir(dir string) bool {
	data, err := os.ReadFile(filepath.Join(dir, FamilyFileName))
	if err != nil {
		return false
	}
	var head struct {
		Parameters []map[string]any `json:"parameters"`
	}
	if json.Unmarshal(data, &head) != nil {
		return false
	}
	for _, p := range head.Parameters {
		if _, ok := p["min_cell"]; ok {
			return true
		}
	}
	return false
}
