# shellcheck shell=bash
# Sourced first by every script as `source .../lib/init.sh DATA_FOLDER_NAME`: finds the checkout
# from this file's own location (so any cwd works), moves there, sets the data and log folders
# and loads the shared helpers.
PARAPET_ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$PARAPET_ROOT" || exit 1
PARAPET_DATA_DIR="$PARAPET_ROOT/${1:-.data}"
PARAPET_LOG_DIR="$PARAPET_DATA_DIR/logs"
mkdir -p "$PARAPET_LOG_DIR"
# shellcheck source=./common.sh
source "$PARAPET_ROOT/docker-free-scripts/lib/common.sh"
# shellcheck source=./postgres.sh
source "$PARAPET_ROOT/docker-free-scripts/lib/postgres.sh"
# shellcheck source=./maildev.sh
source "$PARAPET_ROOT/docker-free-scripts/lib/maildev.sh"
