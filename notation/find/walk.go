package find

import (
	"context"
	"io/fs"
	"path/filepath"
	"strings"
)

// This file implements the one folder walk of the checker and of the
// language server's workspace diagnostics: which files under a folder
// are read for notation.

// skippedFolders are folders of installed dependencies and caches: they
// hold other people's files, often many, and no records of the user's.
var skippedFolders = map[string]bool{"node_modules": true, "__pycache__": true}

// Skipped reports whether a file or folder of this name, found inside a
// walked folder, is left out: hidden entries (a name starting with a
// dot, as .git and .stereoline.json) and dependency and cache folders
// (node_modules, __pycache__).
func Skipped(name string, dir bool) bool {
	return strings.HasPrefix(name, ".") || dir && skippedFolders[name]
}

// WalkHosts calls visit for every regular file below root, in lexical
// order, that host accepts (the caller's test of a host kind, by
// extension or by a configured pattern), leaving out what Skipped names;
// root itself is walked whatever its name. An entry that cannot be read
// is passed to onError (when not nil) and left out, with everything
// below it. The walk ends early when ctx is done, or when visit returns
// fs.SkipAll; any other error visit returns ends it too and is returned.
func WalkHosts(ctx context.Context, root string, host func(path string) bool, visit func(path string, d fs.DirEntry) error, onError func(path string, err error)) error {
	return filepath.WalkDir(root, func(path string, d fs.DirEntry, err error) error {
		if ctx.Err() != nil {
			return fs.SkipAll
		}
		if err != nil {
			if onError != nil {
				onError(path, err)
			}
			if d != nil && d.IsDir() {
				return fs.SkipDir
			}
			return nil
		}
		if path != root && Skipped(d.Name(), d.IsDir()) {
			if d.IsDir() {
				return fs.SkipDir
			}
			return nil
		}
		if d.IsDir() || !d.Type().IsRegular() || !host(path) {
			return nil
		}
		return visit(path, d)
	})
}
