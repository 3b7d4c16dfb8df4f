package document

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
)

// ConfigFileName is the configuration file of a project: a JSON object
// with the fields of Config. The checker and the language server look for
// it in the folder of each file and in every folder above; the nearest
// one wins.
const ConfigFileName = ".stereoline.json"

// ReadConfigFile reads a configuration file on top of the defaults.
// Unknown settings are errors: a misspelt "severty" would otherwise be
// ignored without a word.
func ReadConfigFile(path string) (Config, error) {
	cfg := DefaultConfig()
	data, err := os.ReadFile(path)
	if err != nil {
		return cfg, err
	}
	dec := json.NewDecoder(bytes.NewReader(data))
	dec.DisallowUnknownFields()
	var probe Config
	if err := dec.Decode(&probe); err != nil {
		return cfg, fmt.Errorf("not a valid configuration: %v", err)
	}
	if err := cfg.Merge(data); err != nil {
		return cfg, err
	}
	return cfg, nil
}

// FindConfigFile returns the nearest configuration file in dir or a
// folder above it, and whether there is one.
func FindConfigFile(dir string) (string, bool) {
	abs, err := filepath.Abs(dir)
	if err != nil {
		return "", false
	}
	for d := abs; ; {
		candidate := filepath.Join(d, ConfigFileName)
		if st, err := os.Stat(candidate); err == nil && !st.IsDir() {
			return candidate, true
		}
		parent := filepath.Dir(d)
		if parent == d {
			return "", false
		}
		d = parent
	}
}
