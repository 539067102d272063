#!/usr/bin/env bash
# Installs the Debian packages Swardkeep needs when they are missing: PostgreSQL 15 + PostGIS
# (skipped when DATABASE_URL names an existing server), proj-bin (projinfo), with --browser Chromium for the
# browser tests and with --bench gdal-bin (ogr2ogr) and postgis (shp2pgsql), the plain loads the benchmark
# compares the ingest with. Needs root or sudo; never downloads anything but Debian packages.
set -euo pipefail
need=()
if [ -z "${DATABASE_URL:-}" ] || [ "${SWARDKEEP_LOCAL_DB:-}" = 1 ]; then
  [ -x /usr/lib/postgresql/15/bin/pg_ctl ] || need+=(postgresql-15)
  [ -f /usr/share/postgresql/15/extension/postgis.control ] || need+=(postgresql-15-postgis-3)
fi
# PROJ's command-line tools: projinfo identifies .prj files without an EPSG code (src/lib/gis/proj-cli.server.ts).
command -v projinfo >/dev/null || need+=(proj-bin)
for arg in "$@"; do
  case "$arg" in
    --browser) [ -x /usr/bin/chromium ] || need+=(chromium) ;;
    --bench)
      command -v ogr2ogr >/dev/null || need+=(gdal-bin)
      command -v shp2pgsql >/dev/null || need+=(postgis)
      ;;
  esac
done
[ ${#need[@]} -eq 0 ] && exit 0
echo "setup: installing Debian packages: ${need[*]}"
sudo=""
if [ "$(id -u)" -ne 0 ]; then
  command -v sudo >/dev/null || { echo "setup: ${need[*]} missing and we are not root (no sudo). Install them with apt as root." >&2; exit 1; }
  sudo="sudo -n"
fi
command -v apt-get >/dev/null || { echo "setup: apt-get not found; install ${need[*]} by hand (Debian 12 packages)." >&2; exit 1; }
export DEBIAN_FRONTEND=noninteractive
$sudo apt-get update -qq || { echo "setup: apt-get update failed; check the network to Debian's mirror." >&2; exit 1; }
$sudo apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
echo "setup: installed ${need[*]}"
