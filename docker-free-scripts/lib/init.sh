# shellcheck shell=bash
# Sourced first by every script as `source .../lib/init.sh DATA_FOLDER` (a name in the checkout, or an
# absolute path): finds the checkout from this file's own location (so any cwd works), moves there,
# sets the data and log folders and loads the shared helpers.
PARAPET_ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$PARAPET_ROOT" || exit 1
case ${1:-.data} in
  /*) PARAPET_DATA_DIR=$1 ;; # an absolute folder (start.sh's PARAPET_DATA)
  *) PARAPET_DATA_DIR="$PARAPET_ROOT/${1:-.data}" ;;
esac
PARAPET_LOG_DIR="$PARAPET_DATA_DIR/logs"
mkdir -p "$PARAPET_LOG_DIR"
# shellcheck source=./common.sh
source "$PARAPET_ROOT/docker-free-scripts/lib/common.sh"
# shellcheck source=./postgres.sh
source "$PARAPET_ROOT/docker-free-scripts/lib/postgres.sh"
# shellcheck source=./maildev.sh
source "$PARAPET_ROOT/docker-free-scripts/lib/maildev.sh"
