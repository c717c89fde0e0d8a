#!/usr/bin/env bash
# Runs every LoopShaper test. Installs what the tests need on a fresh Debian machine first:
# ngspice (live AC-analysis checks), chromium (browser tests, report PDFs) and poppler-utils (pdfinfo, pdftotext and
# pdftoppm read the report PDFs back). Octave and SciPy are only needed to
# regenerate reference data or to run the benchmark scripts, not for the tests.
set -euo pipefail
cd "$(dirname "$0")"

need=()
command -v ngspice >/dev/null 2>&1 || need+=(ngspice)
command -v chromium >/dev/null 2>&1 || need+=(chromium)
command -v pdftoppm >/dev/null 2>&1 || need+=(poppler-utils)
if [ ${#need[@]} -gt 0 ]; then
  echo "test.sh: installing ${need[*]}"
  SUDO=""
  [ "$(id -u)" -eq 0 ] || SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi

export DOTNET_CLI_TELEMETRY_OPTOUT=1 DOTNET_NOLOGO=1
# Two cores: build once, then run the test projects one after another.
dotnet build LoopShaper.sln -c Release -m:2 -nologo -v:q
dotnet test LoopShaper.sln -c Release --no-build -nologo -v:q -- RunConfiguration.MaxCpuCount=1 "$@"
