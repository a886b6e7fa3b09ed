#!/usr/bin/env bash
# Installs the Debian 12 packages yeegap needs to build, test and plot. Idempotent: packages that
# are already installed are skipped, so a second run does nothing and needs no network.
# Usage: bash tools/setup.sh [--mpi] [--viewer] [--sanitizers]
#   --mpi     also the MPI toolchain and parallel HDF5
#   --viewer  also ParaView, its Python modules and Xvfb (about 1 GB; do not combine with
#             python3-vtk9 / libvtk9-dev, which conflict with python3-paraview)
#   --sanitizers also clang with its sanitizer and libFuzzer runtimes, OpenMP for clang and
#             llvm-symbolizer, for tools/sanitize.sh (docs/fuzzing.md)
set -euo pipefail

packages=(
  cmake g++ make pkg-config git ca-certificates
  libyaml-cpp-dev libhdf5-dev hdf5-tools
  libgtest-dev libgmock-dev googletest libbenchmark-dev
  libcli11-dev libfmt-dev libeigen3-dev
  python3 python3-h5py python3-numpy python3-matplotlib python3-scipy python3-yaml
)
for arg in "$@"; do
  case "$arg" in
    --mpi) packages+=(libopenmpi-dev openmpi-bin libhdf5-openmpi-dev) ;;
    # python3-paraview is only a Recommends of paraview, which --no-install-recommends below skips.
    --viewer) packages+=(paraview python3-paraview xvfb) ;;
    # The runtimes are only a Recommends of clang, which --no-install-recommends below skips.
    --sanitizers) packages+=(clang libclang-rt-dev libomp-dev llvm) ;;
    *) echo "setup.sh: unknown option '$arg' (expected --mpi, --viewer or --sanitizers)" >&2; exit 2 ;;
  esac
done

missing=()
for p in "${packages[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q 'install ok installed'; then
    missing+=("$p")
  fi
done

if [ ${#missing[@]} -eq 0 ]; then
  echo "setup.sh: all ${#packages[@]} packages present" >&2
  exit 0
fi

as_root=()
if [ "$(id -u)" -ne 0 ]; then
  command -v sudo >/dev/null 2>&1 || { echo "setup.sh: need root or sudo to install: ${missing[*]}" >&2; exit 1; }
  as_root=(sudo)
fi
echo "setup.sh: installing ${missing[*]}" >&2
export DEBIAN_FRONTEND=noninteractive
"${as_root[@]}" apt-get update -qq
"${as_root[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
echo "setup.sh: done" >&2
