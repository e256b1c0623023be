#!/usr/bin/env bash
# Installs what is missing on a fresh Debian machine: PostgreSQL (unless DATABASE_URL is set), Chromium for the
# browser tests, and node modules when they are absent or out of date with package-lock.json.
set -euo pipefail
cd "$(dirname "$0")/.."
mode="${1:-}"

apt_pkgs=()
if [ -z "${DATABASE_URL:-}" ] && ! ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1; then apt_pkgs+=(postgresql); fi
# proj-data: the NTv2 datum-shift grids (BETA2007.gsb, nzgd2kgrid0005.gsb, ntf_r93.gsb) some CRSs need (DATUM_GRID_DIR).
[ -f /usr/share/proj/nzgd2kgrid0005.gsb ] || apt_pkgs+=(proj-data)
if [ "$mode" = "--test" ]; then
  [ -x /usr/bin/chromium ] || apt_pkgs+=(chromium)
  fc-list 2>/dev/null | grep -qi dejavu || apt_pkgs+=(fonts-dejavu-core)
  # pdftotext / pdffonts read the compliance-report PDFs back in the report tests.
  command -v pdftotext >/dev/null || apt_pkgs+=(poppler-utils)
  # ogrinfo reads the CSV export back as GDAL/OGR's CSV driver sees it.
  command -v ogrinfo >/dev/null || apt_pkgs+=(gdal-bin)
  # GDAL's Python samples validate the coverage raster as a Cloud-Optimised GeoTIFF (tests/terrain/coverage-cog.test.ts).
  /usr/bin/python3 -c 'from osgeo_utils.samples import validate_cloud_optimized_geotiff' >/dev/null 2>&1 || apt_pkgs+=(python3-gdal)
  # numpy recomputes the report's percentiles as an outside reference (tests/reports/pdf-text.ts).
  /usr/bin/python3 -c 'import numpy' >/dev/null 2>&1 || apt_pkgs+=(python3-numpy)
  # exiftool writes the synthetic photos' EXIF/XMP that the photo reader must read back (as-flown tests).
  command -v exiftool >/dev/null || apt_pkgs+=(libimage-exiftool-perl)
fi
if [ "${#apt_pkgs[@]}" -gt 0 ]; then
  echo "loftline: installing Debian packages: ${apt_pkgs[*]}"
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update -qq
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${apt_pkgs[@]}" >/dev/null
  # Debian starts its own cluster on 5432 when it installs postgresql; Loftline uses its own, so stop that one.
  if [[ " ${apt_pkgs[*]} " == *" postgresql "* ]] && command -v pg_ctlcluster >/dev/null; then
    "${sudo_cmd[@]}" pg_ctlcluster --skip-systemctl-redirect 15 main stop >/dev/null 2>&1 || true
  fi
fi

lock_hash="$(sha256sum package-lock.json | cut -d' ' -f1)"
if [ ! -f node_modules/.loftline-lock-hash ] || [ "$(cat node_modules/.loftline-lock-hash)" != "$lock_hash" ]; then
  echo "loftline: installing node modules (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$lock_hash" > node_modules/.loftline-lock-hash
fi
