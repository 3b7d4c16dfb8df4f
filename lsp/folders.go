package lsp

import (
	"encoding/json"
	"path/filepath"
	"strings"

	"go.uber.org/zap"

	"stereoline/stereo/document"
)

// Workspace folders (LSP 3.17, "Workspace folders"). The server announces
// that it supports them and wants to hear of changes; the folders the
// client names at initialize, or its root when it names none, are the
// starting set, and workspace/didChangeWorkspaceFolders adds and removes
// folders from then on. Each snapshot holds the set it was built with.
//
// The folders decide two things:
//   - whether project files apply to a document: inside a folder, the
//     nearest one above the document does, as for the checker (it may lie
//     above the folder, at the top of a repository whose subfolder is
//     open); outside every folder, none does, since such a document
//     belongs to no project the user opened and the client watches
//     project files only inside the folders. A client that names no
//     folder and no root gets the checker's rule for every document.
//   - which files on disk a workspace pull reports.

// didChangeWorkspaceFolders applies a folder change: project files cached
// for removed folders are dropped, open documents whose configuration the
// change alters are analysed and published again, and a client that
// pulls is asked to pull again, since the set of files on disk changed.
func (s *Server) didChangeWorkspaceFolders(params json.RawMessage) error {
	var p struct {
		Event struct {
			Added   []folderParam `json:"added"`
			Removed []folderParam `json:"removed"`
		} `json:"event"`
	}
	if err := json.Unmarshal(params, &p); err != nil {
		return err
	}
	added, removed := folderPaths(p.Event.Added), folderPaths(p.Event.Removed)
	for _, root := range removed {
		s.projects.forgetUnder(root)
	}
	s.resettle(func(next *snapshot) {
		next.roots = changeRoots(next.roots, added, removed)
		s.log.Info("workspace folders", zap.Strings("roots", next.roots))
	})
	return nil
}

// folderParam is a WorkspaceFolder, decoded loosely: only file: URIs
// name folders on disk.
type folderParam struct {
	URI  string `json:"uri"`
	Name string `json:"name"`
}

// folderPaths returns the paths on disk of folders with file: URIs.
func folderPaths(folders []folderParam) []string {
	var out []string
	for _, f := range folders {
		if p := fileURIPath(f.URI); p != "" {
			out = append(out, cleanPath(p))
		}
	}
	return out
}

// cleanPath turns the path of a file: URI into a clean path on disk, the
// form every path the server compares is kept in.
func cleanPath(p string) string { return filepath.Clean(filepath.FromSlash(p)) }

// changeRoots returns a new set of roots: roots without removed, then
// added ones it does not hold yet. The slice given is never changed, as
// older snapshots share it.
func changeRoots(roots, added, removed []string) []string {
	out := make([]string, 0, len(roots)+len(added))
	drop := map[string]bool{}
	for _, r := range removed {
		drop[r] = true
	}
	have := map[string]bool{}
	for _, r := range append(append([]string{}, roots...), added...) {
		if drop[r] && !contains(added, r) || have[r] {
			continue
		}
		have[r] = true
		out = append(out, r)
	}
	return out
}

func contains(xs []string, x string) bool {
	for _, y := range xs {
		if y == x {
			return true
		}
	}
	return false
}

// within reports whether path is root or lies below it.
func within(root, path string) bool {
	if path == root {
		return true
	}
	prefix := root
	if !strings.HasSuffix(prefix, string(filepath.Separator)) {
		prefix += string(filepath.Separator)
	}
	return strings.HasPrefix(path, prefix)
}

// inWorkspace reports whether path lies in one of the folders.
func inWorkspace(roots []string, path string) bool {
	for _, r := range roots {
		if within(r, path) {
			return true
		}
	}
	return false
}

// projectFileFor returns the project file that applies to the document
// at path under the workspace folders roots, following the rules above.
func projectFileFor(roots []string, path string) (string, bool) {
	path = filepath.Clean(path)
	if len(roots) > 0 && !inWorkspace(roots, path) {
		return "", false
	}
	return document.FindConfigFile(filepath.Dir(path))
}
