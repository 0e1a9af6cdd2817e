#!/usr/bin/env bash
# Pins the base images of docker/Dockerfile (ARG BASE_IMAGE=…) and docker/compose.yaml (the database's
# image: …) to the digest their tag points at now, as name:tag@sha256:<digest>. Run it where the image
# registry is reachable, review the diff, commit; run it again to move to a newer build of the same tag
# (docs/container.md, "Base images"). The tag stays in the reference for readers; the digest decides.
#
# The digest is resolved with the first of: $PIN_DIGEST_COMMAND (a command given the reference as its
# last argument, printing sha256:…), skopeo, crane, docker buildx imagetools. Files can be overridden with
# PIN_DOCKERFILE and PIN_COMPOSE_FILE (the tests use copies).
set -euo pipefail

ROOT="$(cd "$(dirname "$0")/.." && pwd)"
DOCKERFILE="${PIN_DOCKERFILE:-$ROOT/docker/Dockerfile}"
COMPOSE_FILE="${PIN_COMPOSE_FILE:-$ROOT/docker/compose.yaml}"

resolve() {
  local ref="$1" digest=""
  if [ -n "${PIN_DIGEST_COMMAND:-}" ]; then
    digest="$($PIN_DIGEST_COMMAND "$ref")"
  elif command -v skopeo > /dev/null; then
    digest="$(skopeo inspect --format '{{.Digest}}' "docker://$ref")"
  elif command -v crane > /dev/null; then
    digest="$(crane digest "$ref")"
  elif command -v docker > /dev/null && docker buildx version > /dev/null 2>&1; then
    digest="$(docker buildx imagetools inspect "$ref" --format '{{json .Manifest.Digest}}' | tr -d '"')"
  else
    echo "pin-base-images: no resolver found (install skopeo or crane, or set PIN_DIGEST_COMMAND)" >&2
    exit 2
  fi
  if ! [[ "$digest" =~ ^sha256:[0-9a-f]{64}$ ]]; then
    echo "pin-base-images: $ref resolved to '$digest', not a sha256 digest" >&2
    exit 1
  fi
  printf '%s' "$digest"
}

# pin FILE PREFIX: rewrites every line "PREFIX<name:tag>[@sha256:…]" of FILE (images under localhost/ are local).
pin() {
  local file="$1" prefix="$2" line ref digest
  while IFS= read -r line; do
    ref="${line#"$prefix"}"
    ref="${ref%%@*}"
    ref="${ref%%[[:space:]]*}"
    case "$ref" in localhost/* | "") continue ;; esac
    digest="$(resolve "$ref")"
    echo "pin-base-images: $ref -> $digest ($(basename "$file"))"
    sed -i "s#^${prefix}${ref//./\\.}\(@sha256:[0-9a-f]\{64\}\)\{0,1\}[[:space:]]*\$#${prefix}${ref}@${digest}#" "$file"
  done < <(grep "^${prefix}" "$file")
}

pin "$DOCKERFILE" 'ARG BASE_IMAGE='
pin "$COMPOSE_FILE" '    image: '
