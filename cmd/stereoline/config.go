package main

import (
	"fmt"
	"os"
	"path/filepath"

	"stereoline/stereo/document"
)

// configFileName is the configuration file the checker looks for in the
// folder of each checked file and in every folder above it; the nearest
// one wins. The language server reads the same file.
const configFileName = document.ConfigFileName

// loadedConfig is one configuration file read and validated, with the
// analyzer built for it.
type loadedConfig struct {
	path     string // empty for the built-in defaults
	cfg      document.Config
	analyzer *document.Analyzer
	maxSize  int64 // the maxFileSize setting, in bytes
	sizeSet  bool  // maxSize was set by the file, not the default
	err      error
}

// readConfigFile reads a configuration file on top of the defaults.
func readConfigFile(path string) (document.Config, error) { return document.ReadConfigFile(path) }

// configFor returns the configuration that applies to a checked file: the
// one named by --config, else the nearest configuration file in the
// file's folder or above, else the defaults. Results are cached per
// folder.
func (r *checkRun) configFor(path string) (document.Config, error) {
	lc := r.loadedFor(path)
	return lc.cfg, lc.err
}

// loadedFor is configFor with the analyzer.
func (r *checkRun) loadedFor(path string) *loadedConfig {
	r.cfgMu.Lock()
	defer r.cfgMu.Unlock()
	if r.opts.configFile != "" {
		return r.loadConfigLocked(r.opts.configFile)
	}
	abs, err := filepath.Abs(path)
	if err != nil {
		return r.loadConfigLocked("")
	}
	dir := filepath.Dir(abs)
	var visited []string
	var found *loadedConfig
	for {
		if lc, ok := r.dirConfig[dir]; ok {
			found = lc
			break
		}
		visited = append(visited, dir)
		candidate := filepath.Join(dir, configFileName)
		if st, err := os.Stat(candidate); err == nil && !st.IsDir() {
			found = r.loadConfigLocked(candidate)
			break
		}
		parent := filepath.Dir(dir)
		if parent == dir {
			found = r.loadConfigLocked("")
			break
		}
		dir = parent
	}
	for _, d := range visited {
		r.dirConfig[d] = found
	}
	return found
}

// loadConfigLocked reads a configuration file once; "" is the defaults.
func (r *checkRun) loadConfigLocked(path string) *loadedConfig {
	if lc, ok := r.configs[path]; ok {
		return lc
	}
	lc := &loadedConfig{path: path, cfg: document.DefaultConfig()}
	if path != "" {
		lc.cfg, lc.err = readConfigFile(path)
		if lc.err != nil {
			lc.err = fmt.Errorf("%s: %v", filepath.ToSlash(path), lc.err)
		}
	}
	lc.maxSize, _ = document.ParseSize(document.DefaultMaxFileSize)
	if lc.cfg.MaxFileSize != "" && lc.err == nil {
		lc.maxSize, lc.err = document.ParseSize(lc.cfg.MaxFileSize) // checked by Validate
		lc.sizeSet = true
	}
	// --lone-pair and --ring-marks win over the file (checked when the
	// options were read)
	lc.cfg.Reading, _ = r.opts.reading.config(lc.cfg.Reading)
	// so do --record-time and --digraph-nodes
	lc.cfg.Limits, _ = r.opts.limits.config(lc.cfg.Limits)
	// Analyzers of different configurations share one cache, keyed by
	// the reading setting, the one part of the configuration analyses
	// depend on.
	if r.baseAnalyzer == nil {
		r.baseAnalyzer = document.NewAnalyzer(lc.cfg)
		lc.analyzer = r.baseAnalyzer
	} else {
		lc.analyzer = r.baseAnalyzer.WithConfig(lc.cfg)
	}
	r.configs[path] = lc
	return lc
}
