#!/usr/bin/env bash
# Installs what the atlas needs on a Debian 12 machine (run as root; skips what is already there) and builds it.
# Used by deploy/demo.sh and deploy/test.sh; safe to re-run.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$here"

runtime_packages=(postgresql-15 postgresql-15-postgis-3 postgresql-contrib libnetcdf19 fonts-dejavu-core libfontconfig1)
test_packages=(libnetcdf-dev netcdf-bin b3sum cdo gdal-bin python3-numpy python3-scipy python3-netcdf4 python3-xarray python3-pandas python3-matplotlib python3-colorcet python3-pil librsvg2-bin poppler-utils chromium wrk docker-compose)

want=("${runtime_packages[@]}")
command -v npm > /dev/null || want+=(nodejs npm)
[ "${1:-}" = "--with-test-tools" ] && want+=("${test_packages[@]}")
missing=()
for p in "${want[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ "${#missing[@]}" -gt 0 ]; then
  echo "atlas: installing ${missing[*]}"
  if [ "$(id -u)" -ne 0 ]; then echo "atlas: run as root to install packages (or install them yourself)"; exit 1; fi
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi

if [ -f wwwroot/package.json ]; then
  if [ ! -d wwwroot/node_modules ] || [ wwwroot/package-lock.json -nt wwwroot/node_modules ]; then
    echo "atlas: installing the page's libraries from npm"
    (cd wwwroot && npm ci --no-audit --no-fund --loglevel=error)
  fi
fi

echo "atlas: building"
dotnet build Atlas.sln -c Release -nologo -v quiet -clp:ErrorsOnly
# The atlas command itself, compiled ahead of time (ReadyToRun) over the build: every command is a process of its own
# (workers, ingests, statistics passes), and each spent about 0.4 s of processor time compiling the same methods at
# its start (tests/benchmarks/pipeline.sh: the statistics pass 2.4-2.8 s instead of 3.0-3.1 s).
echo "atlas: compiling the command ahead of time"
dotnet publish src/Atlas.Cli/Atlas.Cli.csproj -c Release -r linux-x64 --self-contained false -p:PublishReadyToRun=true \
  -o src/Atlas.Cli/bin/Release/net10.0 -nologo -v quiet -clp:ErrorsOnly
