#!/usr/bin/env bash
# Runs the real-client tests against `stereoline serve`: Neovim headless,
# Emacs with eglot in batch mode, a Node LSP 3.17 client, the VS Code
# extension (type check, bundle, grammar test, the bundle activated with a
# stand-in vscode module, package) and a parse of the Helix fragment. It builds the server once, prints PASS or FAIL
# per client and ends with "N passed, N failed"; the exit status is
# non-zero when any client failed.
#
# Needs nvim, emacs with elpa-eglot, node and npm on PATH (.ci/run
# installs them); npm packages are installed here with `npm ci` into
# editors/vscode/node_modules and editors/tests/node/node_modules.
set -uo pipefail
here=$(cd "$(dirname "$0")" && pwd)
root=$(cd "$here/../.." && pwd)
export PATH=/usr/local/go/bin:$PATH
export GOFLAGS=${GOFLAGS:--mod=mod}
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT

passed=0
failed=0
failures=()

# client NAME FUNCTION: runs an exported FUNCTION with a time limit,
# shows its output indented and counts the result.
client() {
  local name=$1
  shift
  local start=$SECONDS
  timeout 240 bash -c "$*" >"$tmp/$name.log" 2>&1
  local rc=$?
  sed 's/^/    /' "$tmp/$name.log"
  # Checks a client skipped (a feature the server does not offer yet) are
  # named in its output and counted here, so a PASS says what it left out.
  local skips
  skips=$(grep -cE '^[[:space:]]*(skip[[:space:]]|﹣ )' "$tmp/$name.log")
  local note=""
  [ "$skips" -gt 0 ] && note=", skipped checks: $skips"
  if [ $rc -eq 0 ]; then
    passed=$((passed + 1))
    echo "PASS $name ($((SECONDS - start))s$note)"
  else
    failed=$((failed + 1))
    failures+=("$name")
    [ $rc -eq 124 ] && echo "    (timed out)"
    echo "FAIL $name (exit $rc, $((SECONDS - start))s)"
  fi
}

need() {
  command -v "$1" >/dev/null 2>&1 || { echo "$1 is not installed: $2"; return 1; }
}

# npm_ci DIR: install the locked packages unless they are already there.
npm_ci() {
  if [ ! -d "$1/node_modules" ] || [ "$1/package-lock.json" -nt "$1/node_modules/.package-lock.json" ]; then
    (cd "$1" && npm ci --no-audit --no-fund --loglevel=error)
  fi
}

echo "== build the server"
bin="$tmp/stereoline"
if ! (cd "$root" && go build -o "$bin" ./cmd/stereoline); then
  echo "FAIL build"
  echo "0 passed, 1 failed"
  exit 1
fi
help=$("$bin" serve --help 2>&1)
if [[ $help != *"stereoline serve"* ]]; then
  echo "FAIL build: the binary has no serve command"
  echo "0 passed, 1 failed"
  exit 1
fi
export STEREOLINE_BIN="$bin"
export STEREOLINE_FIXTURES="$here/fixtures"

neovim() {
  need nvim "apt-get install neovim" || return 1
  nvim --version | head -1
  local work="$tmp/neovim"
  mkdir -p "$work" && cp "$here"/fixtures/sample.py "$here"/fixtures/sample.smi "$here"/fixtures/sample.jsonl "$work"/
  STEREOLINE_WORK="$work" nvim --headless -u NONE -i NONE -n \
    --cmd "set rtp^=$root/editors/neovim" -c "luafile $here/neovim/test.lua" </dev/null
}

emacs_eglot() {
  need emacs "apt-get install emacs-nox elpa-eglot" || return 1
  emacs --version | head -1
  local work="$tmp/emacs"
  mkdir -p "$work" && cp "$here"/fixtures/sample.py "$here"/fixtures/sample.smi "$here"/fixtures/sample.jsonl "$work"/
  STEREOLINE_WORK="$work" STEREOLINE_EMACS="$root/editors/emacs" \
    emacs --batch -l "$here/emacs/test.el" </dev/null 2> >(grep -v '^Loading /etc/emacs' >&2)
}

node_client() {
  need node "apt-get install nodejs npm" || return 1
  npm_ci "$here/node" || return 1
  (cd "$here/node" && node --test --test-reporter=spec client.test.mjs)
}

vscode() {
  need npm "apt-get install npm" || return 1
  local dir="$root/editors/vscode"
  npm_ci "$dir" || return 1
  (
    set -e
    cd "$dir"
    echo "tsc --noEmit"
    npx --no-install tsc --noEmit -p .
    npm run --silent bundle
    # the grammar test, then the bundle activated with a stand-in vscode
    # module against the real server
    node --test --test-reporter=spec test/
    npx --no-install vsce package --no-dependencies --skip-license --allow-missing-repository --out "$tmp/stereoline.vsix" </dev/null
    # The package must hold the manifest, the bundle and the grammar.
    python3 - "$tmp/stereoline.vsix" <<'PY'
import sys, zipfile
names = set(zipfile.ZipFile(sys.argv[1]).namelist())
want = {"extension/package.json", "extension/dist/extension.js", "extension/syntaxes/smiles.tmLanguage.json"}
missing = want - names
if missing:
    sys.exit("missing from the .vsix: " + ", ".join(sorted(missing)))
print("vsix holds", ", ".join(sorted(want)))
PY
  )
}

helix() {
  # Helix is not packaged for this system: check the fragment parses as
  # TOML and starts `stereoline serve` for the smiles and jsonl languages.
  python3 - "$root/editors/helix/languages.toml" <<'PY'
import sys, tomllib
c = tomllib.load(open(sys.argv[1], "rb"))
ls = c["language-server"]["stereoline"]
assert ls["command"] == "stereoline" and ls["args"] == ["serve"], ls
assert "stereoline" in ls["config"], "settings must sit under the stereoline section"
smiles = [l for l in c["language"] if l["name"] == "smiles"][0]
assert set(smiles["file-types"]) == {"smi", "smiles", "rsmi"}, smiles
assert "stereoline" in smiles["language-servers"], smiles
jsonl = [l for l in c["language"] if l["name"] == "jsonl"][0]
assert set(jsonl["file-types"]) == {"jsonl", "ndjson"} and jsonl["language-id"] == "jsonl", jsonl
assert "stereoline" in jsonl["language-servers"], jsonl
print("languages.toml parses; smiles and JSON Lines files go to stereoline serve")
PY
}

export here root tmp
export -f need npm_ci neovim emacs_eglot node_client vscode helix

client neovim neovim
client emacs-eglot emacs_eglot
client node-client node_client
client vscode-extension vscode
client helix-config helix

if [ $failed -gt 0 ]; then
  echo "failed: ${failures[*]}"
fi
echo "$passed passed, $failed failed"
[ $failed -eq 0 ]
