#!/usr/bin/env bash
# Installs the Debian 12 packages lacuna needs to build, test and benchmark.
# Idempotent: when everything is present it only checks, in about a second.
set -euo pipefail

packages=(
  g++ cmake make ninja-build pkg-config
  libboost-dev          # Boost.Multiprecision (header-only), the one public dependency
  doctest-dev           # tests
  libbenchmark-dev      # benchmarks (Google Benchmark)
  libflint-dev          # reference library for cross-checks in tests and benchmarks
  nlohmann-json3-dev    # tests: the tool's JSON output is parsed back
  libcli11-dev          # argument parsing of the command-line tool
  zlib1g-dev            # gzip-encoded NRRD volumes
  libexpat1-dev         # tests: the SVG pictures of persistence are parsed back as XML
  doxygen               # the API reference (target docs, test docs/api_reference)
  clang                 # libFuzzer targets
  libclang-rt-14-dev    # sanitizer and fuzzer runtimes for clang
  libopenmpi-dev        # the MPI part (include/lacuna/distributed/, lacuna-mpi, tests/distributed/)
  openmpi-bin           # mpiexec, which runs the tests of the MPI part
  dpkg-dev              # cpack -G DEB: dpkg-shlibdeps finds the tool's library dependencies
  python3               # tests/python: the second checker of certificates (standard library only)
)

missing=()
for p in "${packages[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed"; then
    missing+=("$p")
  fi
done

if ((${#missing[@]})); then
  echo "lacuna setup: installing ${missing[*]}" >&2
  if [[ $(id -u) -ne 0 ]]; then
    echo "lacuna setup: run as root (or install these packages yourself): ${missing[*]}" >&2
    exit 1
  fi
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq --no-install-recommends "${missing[@]}"
else
  echo "lacuna setup: all packages present" >&2
fi
