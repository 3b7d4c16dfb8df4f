package main

import (
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// nciFirst5K is the NCI set of Debian's rdkit-data.
const nciFirst5K = "/usr/share/RDKit/Data/NCI/first_5K.smi"

// relationScript writes a list with many relations with Debian's
// python3-rdkit: the stereoisomers of the first molecules of the NCI set
// (rdkit-data), up to four each, by RDKit's EnumerateStereoisomers, some
// written twice (once in a random atom order: the same structure written
// otherwise) and some with their marks removed (the constitution alone);
// shuffled with a fixed seed.
const relationScript = `
import random, sys
from rdkit import Chem, RDLogger
from rdkit.Chem.EnumerateStereoisomers import EnumerateStereoisomers, StereoEnumerationOptions
RDLogger.DisableLog("rdApp.*")
rng = random.Random(13)
opts = StereoEnumerationOptions(tryEmbedding=False, maxIsomers=4, unique=True)
recs = []
with open(sys.argv[1]) as f:
    for i, line in zip(range(int(sys.argv[2])), f):
        mol = Chem.MolFromSmiles(line.split()[0])
        if mol is None:
            continue
        for j, iso in enumerate(EnumerateStereoisomers(mol, options=opts)):
            recs.append(Chem.MolToSmiles(iso))
            if (i + j) % 5 == 0:
                recs.append(Chem.MolToSmiles(iso, doRandom=True))
        if i % 7 == 0:
            recs.append(Chem.MolToSmiles(mol, isomericSmiles=False))
rng.shuffle(recs)
for k, r in enumerate(recs):
    print(r, "rec%d" % (k + 1))
`

// relationList runs relationScript over the first n molecules of the NCI
// set.
func relationList(t *testing.T, n int) []string {
	t.Helper()
	if _, err := os.Stat(nciFirst5K); err != nil {
		t.Skipf("rdkit-data's NCI set is not installed (%v); apt-get install rdkit-data", err)
	}
	out, err := exec.Command("/usr/bin/python3", "-c", relationScript, nciFirst5K, strconv.Itoa(n)).Output()
	if err != nil {
		t.Skipf("Debian's python3-rdkit did not run (%v); apt-get install python3-rdkit", err)
	}
	return strings.Split(strings.TrimSpace(string(out)), "\n")
}

// components joins records (1-based lines) by edges and returns the sets
// of two or more, each sorted, sorted.
func components(edges [][2]int) [][]int {
	parent := map[int]int{}
	var root func(int) int
	root = func(x int) int {
		if p, ok := parent[x]; ok && p != x {
			r := root(p)
			parent[x] = r
			return r
		}
		parent[x] = x
		return x
	}
	for _, e := range edges {
		a, b := root(e[0]), root(e[1])
		if a != b {
			parent[max(a, b)] = min(a, b)
		}
	}
	sets := map[int][]int{}
	for x := range parent {
		r := root(x)
		sets[r] = append(sets[r], x)
	}
	var out [][]int
	for _, s := range sets {
		if len(s) > 1 {
			slices.Sort(s)
			out = append(out, s)
		}
	}
	slices.SortFunc(out, slices.Compare)
	return out
}

// TestKeysDaskRecipe runs the README's recipe (testdata/scale/
// dask_relations.py) on a LocalCluster of two workers over a list cut in
// four shards, and requires that its group-by finds exactly the
// duplicates and stereoisomers that check finds on the whole list, and
// every mirror image check finds among its pairs.
func TestKeysDaskRecipe(t *testing.T) {
	if testing.Short() {
		t.Skip("starts a Dask cluster")
	}
	if err := exec.Command("/usr/bin/python3", "-c", "import dask.bag, distributed").Run(); err != nil {
		t.Skipf("Dask is not installed for /usr/bin/python3 (%v); apt-get install python3-dask python3-distributed", err)
	}
	recs := relationList(t, 1200)
	dir := t.TempDir()
	whole := filepath.Join(dir, "whole.smi")
	if err := os.WriteFile(whole, []byte(strings.Join(recs, "\n")+"\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	// Four shards of consecutive records: line l of shard k is line
	// first[k]+l of the whole list.
	var shards []string
	first := map[string]int{}
	per := (len(recs) + 3) / 4
	for k := 0; k*per < len(recs); k++ {
		p := filepath.Join(dir, fmt.Sprintf("shard%d.smi", k))
		part := recs[k*per : min((k+1)*per, len(recs))]
		if err := os.WriteFile(p, []byte(strings.Join(part, "\n")+"\n"), 0o644); err != nil {
			t.Fatal(err)
		}
		shards = append(shards, p)
		first[p] = k * per
	}

	// What check finds on the whole list: each relation names the
	// earlier record by its line.
	stdout, stderr, status := runCheck(t, "", "--format", "json", whole)
	if status > 1 {
		t.Fatalf("check: status %d: %s", status, stderr)
	}
	earlierLine := regexp.MustCompile(`\bline (\d+)`)
	var dupEdges, allEdges, mirrorEdges [][2]int
	for _, line := range strings.Split(strings.TrimSpace(stdout), "\n") {
		var f struct {
			Code, Message string
			Range         struct{ Start struct{ Line int } }
		}
		if err := json.Unmarshal([]byte(line), &f); err != nil {
			t.Fatalf("%v: %s", err, line)
		}
		if !strings.HasPrefix(f.Code, "list-") {
			continue
		}
		m := earlierLine.FindStringSubmatch(f.Message)
		if m == nil {
			t.Fatalf("a relation without the earlier record's line: %s", line)
		}
		e, _ := strconv.Atoi(m[1])
		edge := [2]int{f.Range.Start.Line + 1, e}
		allEdges = append(allEdges, edge)
		switch f.Code {
		case "list-duplicate":
			dupEdges = append(dupEdges, edge)
		case "list-enantiomer":
			mirrorEdges = append(mirrorEdges, edge)
		}
	}
	t.Logf("%d records; check: %d duplicates, %d mirror images, %d relations in all", len(recs), len(dupEdges), len(mirrorEdges), len(allEdges))
	if len(dupEdges) < 20 || len(allEdges) < 100 || len(mirrorEdges) < 20 {
		t.Fatalf("too few relations to test: %d duplicates, %d mirror images, %d in all", len(dupEdges), len(mirrorEdges), len(allEdges))
	}

	bin := filepath.Join(dir, "stereoline")
	if out, err := exec.Command("go", "build", "-o", bin, ".").CombinedOutput(); err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	cmd := exec.Command("/usr/bin/python3", "../../testdata/scale/dask_relations.py", "--workers", "2", "--stereoline", bin)
	cmd.Args = append(cmd.Args, shards...)
	cmd.Stderr = os.Stderr
	out, err := cmd.Output()
	if err != nil {
		t.Fatalf("the recipe: %v", err)
	}
	var got struct {
		Records       int
		Duplicates    [][]string
		Stereoisomers [][]string
		Enantiomers   [][2][]string
	}
	if err := json.Unmarshal(out, &got); err != nil {
		t.Fatalf("the recipe's output: %v\n%s", err, out)
	}
	if got.Records != len(recs) {
		t.Errorf("the recipe saw %d records, the list has %d", got.Records, len(recs))
	}
	lineOf := func(place string) int {
		i := strings.Index(place, ".smi:")
		l, err := strconv.Atoi(strings.SplitN(place[i+len(".smi:"):], ":", 2)[0])
		if err != nil {
			t.Fatalf("place %q: %v", place, err)
		}
		return first[place[:i+len(".smi")]] + l
	}
	lines := func(sets [][]string) [][]int {
		var out [][]int
		for _, s := range sets {
			var ls []int
			for _, p := range s {
				ls = append(ls, lineOf(p))
			}
			slices.Sort(ls)
			out = append(out, ls)
		}
		slices.SortFunc(out, slices.Compare)
		return out
	}
	for _, c := range []struct {
		name      string
		check, gb [][]int
	}{
		{"duplicates", components(dupEdges), lines(got.Duplicates)},
		{"stereoisomers", components(allEdges), lines(got.Stereoisomers)},
	} {
		if !slices.EqualFunc(c.check, c.gb, slices.Equal) {
			t.Errorf("%s: check finds %d sets, the recipe %d\ncheck:  %v\nrecipe: %v", c.name, len(c.check), len(c.gb), c.check, c.gb)
		}
	}
	side := map[int][2]int{} // line -> pair index, side
	for pi, pair := range got.Enantiomers {
		for s := range 2 {
			for _, p := range pair[s] {
				side[lineOf(p)] = [2]int{pi, s}
			}
		}
	}
	for _, e := range mirrorEdges {
		a, okA := side[e[0]]
		b, okB := side[e[1]]
		if !okA || !okB || a[0] != b[0] || a[1] == b[1] {
			t.Errorf("check finds line %d the mirror image of line %d; the recipe's pairs do not", e[0], e[1])
		}
	}
}
