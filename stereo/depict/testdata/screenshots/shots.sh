#!/bin/sh
# Renders the drawings of records.smi (and the Fischer view of the sugar)
# to PNG with headless Chromium (Debian package chromium), for a person
# to look at. Usage, from the repository root:
#   sh stereo/depict/testdata/screenshots/shots.sh [OUTDIR]
# OUTDIR defaults to a new temporary folder; the PNGs are not committed.
set -eu
here=$(cd "$(dirname "$0")" && pwd)
out=${1:-$(mktemp -d)}
mkdir -p "$out"
go build -o "$out/stereoline" ./cmd/stereoline
"$out/stereoline" draw --out "$out/svg" "$here/records.smi" || true
grep 'D-glucose' "$here/records.smi" | "$out/stereoline" draw --fischer --out "$out/svg-fischer"
mv "$out/svg-fischer/"*.svg "$out/svg/99-D-glucose-fischer.svg"
shot() { # svg png scheme
  w=$(sed -n 's/^<svg[^>]* width="\([0-9.]*\)".*/\1/p' "$1" | head -1)
  h=$(sed -n 's/^<svg[^>]* height="\([0-9.]*\)".*/\1/p' "$1" | head -1)
  profile=$(mktemp -d)
  dark=""
  [ "$3" = dark ] && dark="--force-dark-mode"
  /usr/bin/chromium --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
    --disable-background-networking --disable-component-update --disable-sync \
    --user-data-dir="$profile" $dark --hide-scrollbars --screenshot="$2" \
    --window-size="${w%.*},${h%.*}" "file://$1" >/dev/null 2>&1
  rm -rf "$profile"
}
for f in "$out"/svg/*.svg; do
  b=$(basename "$f" .svg)
  shot "$f" "$out/$b.png" light
done
shot "$(ls "$out"/svg/*.svg | head -1)" "$out/dark-example.png" dark
echo "screenshots in $out"
