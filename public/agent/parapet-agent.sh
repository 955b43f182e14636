#!/bin/sh
# Parapet heartbeat agent: every interval, post one JSON report about this router.
# POSIX sh (busybox ash, dash). Needs awk, sed, date, and curl or wget.
#
# Usage: parapet-agent.sh [--once]     --once sends one cycle and exits:
#   0 delivered, 1 kept in the buffer for later, 2 refused by the server, 3 misconfigured.
# Settings come from the environment first, then $PARAPET_CONFIG (PARAPET_X=value
# lines, default /etc/parapet/agent.conf), then the defaults below. The counter and the
# buffer of unsent reports live in RAM (/tmp/parapet), so reporting never writes to flash.
#
# Radios, read with `iw`:
#   access point: clients = associated stations; signalDbm, txRateMbps, rxRateMbps are
#     those of the WEAKEST station (the one that needs attention); no peerMac.
#   client (managed) or mesh: peerMac, signal and rates of the peer (weakest if several).
#   every radio: mac, its own address from `iw dev`, so Parapet can tell which radios talk.
# A figure that cannot be read is left out, never guessed.

set -u
set -f                    # no globbing: interface names and settings are data
LC_ALL=C; export LC_ALL   # byte-wise awk, so iw's \xNN SSID escapes decode to bytes

log() { printf 'parapet-agent: %s\n' "$*" >&2; }
die() { log "$*"; exit 3; }

PARAPET_CONFIG="${PARAPET_CONFIG:-/etc/parapet/agent.conf}"
if [ -r "$PARAPET_CONFIG" ]; then
  while IFS= read -r line || [ -n "$line" ]; do
    key=${line%%=*}; val=${line#*=}
    [ "$key" = "$line" ] && continue
    case $key in PARAPET_*) ;; *) continue ;; esac
    case $key in *[!A-Z0-9_]*) continue ;; esac
    eval "isset=\${$key+x}"
    [ -n "$isset" ] && continue           # the environment wins over the file
    case $val in \"*\") val=${val#\"}; val=${val%\"} ;; \'*\') val=${val#\'}; val=${val%\'} ;; esac
    eval "$key=\$val"
  done < "$PARAPET_CONFIG"
fi

# The provisioning page fills in these two lines for each node.
PARAPET_URL="${PARAPET_URL:-__PARAPET_URL__}"
PARAPET_TOKEN="${PARAPET_TOKEN:-__PARAPET_TOKEN__}"
PARAPET_INTERVAL_S="${PARAPET_INTERVAL_S:-60}"
PARAPET_STATE_DIR="${PARAPET_STATE_DIR:-}"
PARAPET_PROC="${PARAPET_PROC:-/proc}"
PARAPET_IW="${PARAPET_IW:-iw}"
PARAPET_OS_RELEASE="${PARAPET_OS_RELEASE:-/etc/os-release}"     # NAME, VERSION, PRETTY_NAME (freedesktop os-release)
PARAPET_VERSION_FILE="${PARAPET_VERSION_FILE:-/etc/version}"     # first line: the version, when os-release has none
PARAPET_BUFFER_MAX="${PARAPET_BUFFER_MAX:-500}"
PARAPET_HTTP="${PARAPET_HTTP:-auto}"     # auto, curl or wget
PARAPET_TIMEOUT_S="${PARAPET_TIMEOUT_S:-20}"
BATCH_MAX=500                            # the server takes at most 500 reports a request

once=0
for arg in "$@"; do
  case $arg in
    --once) once=1 ;;
    *) die "unknown argument '$arg': use --once, or no argument to run forever" ;;
  esac
done

case $PARAPET_URL in ''|*__PARAPET_*) die "PARAPET_URL is not set: download the agent again from the node's provisioning page, or set PARAPET_URL" ;; esac
case $PARAPET_TOKEN in ''|*__PARAPET_*) die "PARAPET_TOKEN is not set: download the agent again from the node's provisioning page, or set PARAPET_TOKEN" ;; esac
for pair in "PARAPET_INTERVAL_S=$PARAPET_INTERVAL_S" "PARAPET_BUFFER_MAX=$PARAPET_BUFFER_MAX" "PARAPET_TIMEOUT_S=$PARAPET_TIMEOUT_S"; do
  case ${pair#*=} in ''|*[!0-9]*|0) die "${pair%%=*} must be a whole number above 0, not '${pair#*=}'" ;; esac
done
URL="${PARAPET_URL%/}/api/v1/heartbeats"

if [ -z "$PARAPET_STATE_DIR" ]; then
  # RAM-backed /tmp, never flash: a counter written every interval would wear a router's flash out
  # over the years. A reboot clears it; the boot id sent with each report tells the server so.
  PARAPET_STATE_DIR=/tmp/parapet
fi
mkdir -p "$PARAPET_STATE_DIR" 2>/dev/null || die "cannot create PARAPET_STATE_DIR '$PARAPET_STATE_DIR'"
[ -w "$PARAPET_STATE_DIR" ] || die "cannot write to PARAPET_STATE_DIR '$PARAPET_STATE_DIR'"
SEQ_FILE="$PARAPET_STATE_DIR/seq"
# The kernel's boot id: with it, the server tells a rebooted router counting from 1 from a repeat.
BOOT_ID=$(head -n 1 "$PARAPET_PROC/sys/kernel/random/boot_id" 2>/dev/null) || BOOT_ID=""
case $BOOT_ID in *[!A-Za-z0-9-]*) BOOT_ID="" ;; esac
[ "${#BOOT_ID}" -le 64 ] || BOOT_ID=""
BUFFER="$PARAPET_STATE_DIR/buffer.jsonl"
# Scratch files live in RAM-backed /tmp so a cycle does not wear the router's flash.
TMPD=$(mktemp -d "${TMPDIR:-/tmp}/parapet-agent.XXXXXX") || die "cannot create a temporary directory"
trap 'rm -rf "$TMPD"' EXIT
trap 'exit 130' INT; trap 'exit 143' TERM
QUEUE="$TMPD/queue"

HTTP=$PARAPET_HTTP
[ "$HTTP" = auto ] && { command -v curl >/dev/null 2>&1 && HTTP=curl || HTTP=wget; }
case $HTTP in curl|wget) ;; *) die "PARAPET_HTTP must be auto, curl or wget, not '$HTTP'" ;; esac
command -v "$HTTP" >/dev/null 2>&1 || die "$HTTP is not installed: install curl or wget"
WGET_OPTS=""
[ "$HTTP" = wget ] && case $(wget --help 2>&1) in
  # GNU wget retries 20 times by default and drops error bodies unless asked
  *GNU\ Wget*) WGET_OPTS="-T $PARAPET_TIMEOUT_S -t 1 --content-on-error" ;;
  # some busybox builds lack -T and crash when given it
  *-T\ *) WGET_OPTS="-T $PARAPET_TIMEOUT_S" ;;
esac

# Raw `iw` output with section markers, for the report's awk program.
iw_dump() {
  "$PARAPET_IW" dev > "$TMPD/iwdev" 2>/dev/null || return 0
  echo "@@dev"; cat "$TMPD/iwdev"
  awk '$1 == "Interface" && $2 ~ /^[A-Za-z0-9._-]+$/ { print $2 }' "$TMPD/iwdev" | while read -r iface; do
    echo "@@sta $iface"
    "$PARAPET_IW" dev "$iface" station dump 2>/dev/null || echo "@@fail"
    echo "@@survey $iface"
    "$PARAPET_IW" dev "$iface" survey dump 2>/dev/null
  done
}

# Prints one report as a single JSON line; $1 is its seq.
build_report() {
  iw_dump | awk -v seq="$1" -v bootId="$BOOT_ID" -v sentAt="$(date -u +%Y-%m-%dT%H:%M:%SZ)" \
    -v proc="$PARAPET_PROC" -v release="$PARAPET_OS_RELEASE" -v versionfile="$PARAPET_VERSION_FILE" \
    -v kernel="$(uname -r 2>/dev/null)" -v q="'" '
  function isnum(s) { return s ~ /^-?(0|[1-9][0-9]*)(\.[0-9]+)?$/ }
  function hexval(h) { h = tolower(h); return (index("0123456789abcdef", substr(h, 1, 1)) - 1) * 16 + index("0123456789abcdef", substr(h, 2, 1)) - 1 }
  # JSON string contents; with iw=1, first undo the \xNN escapes iw prints in SSIDs
  function jstr(s, iw,   out, i, c, n) {
    out = ""
    for (i = 1; i <= length(s); i++) {
      c = substr(s, i, 1)
      if (iw && c == "\\" && substr(s, i + 1, 3) ~ /^x[0-9a-fA-F][0-9a-fA-F]$/) {
        n = hexval(substr(s, i + 2, 2)); i += 3
        if (n < 32 || n == 127) { out = out sprintf("\\u%04x", n); continue }
        c = sprintf("%c", n)
      }
      if (c == "\\" || c == "\"") out = out "\\" c
      else if (c in ctl) out = out sprintf("\\u%04x", ctl[c])
      else out = out c
    }
    return out
  }
  BEGIN {
    for (i = 1; i < 32; i++) ctl[sprintf("%c", i)] = i
    ctl[sprintf("%c", 127)] = 127
    out = "{\"seq\":" seq (bootId != "" ? ",\"bootId\":\"" bootId "\"" : "") ",\"sentAt\":\"" sentAt "\""
    if ((getline line < (proc "/uptime")) > 0 && split(line, f, " ") && f[1] ~ /^[0-9]+(\.[0-9]+)?$/)
      out = out ",\"uptimeS\":" int(f[1])
    if ((getline line < (proc "/loadavg")) > 0 && split(line, f, " ") && isnum(f[1]))
      out = out ",\"load1\":" f[1]
    while ((getline line < (proc "/meminfo")) > 0) {
      split(line, f, " ")
      if (f[1] == "MemAvailable:") avail = f[2]
      if (f[1] == "MemFree:") free = f[2]
    }
    mem = (avail != "") ? avail : free   # MemAvailable is absent before Linux 3.14
    if (mem ~ /^[0-9]+$/) out = out ",\"memFreeKb\":" mem
    # Firmware: PRETTY_NAME, else NAME and VERSION (or VERSION_ID); only the version may come from
    # the version file; with no os-release at all, the kernel release.
    while ((getline line < release) > 0) {
      eq = index(line, "="); if (eq < 2) continue
      k = substr(line, 1, eq - 1); v = substr(line, eq + 1); gsub("^[\"" q "]|[\"" q "]$", "", v)
      if (k == "PRETTY_NAME") pretty = v
      if (k == "NAME") osname = v
      if (k == "VERSION") osver = v
      if (k == "VERSION_ID") osid = v
    }
    if (osver == "") osver = osid
    if (osname != "" && osver == "" && (getline line < versionfile) > 0) { osver = line; gsub(/^[ \t]+|[ \t\r]+$/, "", osver) }
    if (pretty != "") fw = pretty
    else if (osname != "") fw = (osver != "") ? osname " " osver : osname
    if (fw == "") fw = kernel
    if (fw != "") out = out ",\"firmware\":\"" jstr(fw, 0) "\""
  }
  /^@@dev/ { sec = "dev"; next }
  /^@@sta / { sec = "sta"; cur = $2; nsta[cur] += 0; next }
  /^@@survey / { sec = "survey"; cur = $2; inuse = 0; next }
  /^@@fail/ { stafail[cur] = 1; next }
  sec == "dev" && $1 == "Interface" { cur = $2; order[++nif] = cur; next }
  sec == "dev" && $1 == "ssid" { s = $0; sub(/^[ \t]*ssid /, "", s); ssid[cur] = s; next }
  sec == "dev" && $1 == "addr" { addr[cur] = $2; next }
  sec == "dev" && $1 == "type" { s = $0; sub(/^[ \t]*type /, "", s); type[cur] = s; next }
  sec == "dev" && $1 == "channel" {
    chan[cur] = $2
    if (match($0, /width: [0-9]+/)) width[cur] = substr($0, RSTART + 7, RLENGTH - 7)
    next
  }
  # "signal avg:" and "beacon signal avg:" are other lines; only "signal:" is the current one
  sec == "sta" && $1 == "Station" { k = ++nsta[cur]; mac[cur, k] = $2; next }
  sec == "sta" && $1 == "signal:" { sig[cur, nsta[cur]] = $2; next }
  sec == "sta" && $1 == "tx" && $2 == "bitrate:" { tx[cur, nsta[cur]] = $3; next }
  sec == "sta" && $1 == "rx" && $2 == "bitrate:" { rx[cur, nsta[cur]] = $3; next }
  sec == "survey" && $1 == "frequency:" { inuse = ($0 ~ /\[in use\]/); next }
  sec == "survey" && $1 == "noise:" && inuse { noise[cur] = $2; next }
  END {
    out = out ",\"radios\":["
    for (r = 1; r <= nif; r++) {
      i = order[r]
      o = "{\"iface\":\"" jstr(i, 0) "\""
      if (chan[i] ~ /^[0-9]+$/) o = o ",\"channel\":" chan[i]
      if (width[i] ~ /^[0-9]+$/) o = o ",\"channelWidthMHz\":" width[i]
      if (i in ssid) o = o ",\"ssid\":\"" jstr(ssid[i], 1) "\""
      if (length(addr[i]) == 17 && addr[i] ~ /^[0-9a-fA-F:]+$/) o = o ",\"mac\":\"" tolower(addr[i]) "\""
      w = (nsta[i] > 0) ? 1 : 0          # the station to report: the weakest signal
      for (k = 2; k <= nsta[i]; k++)
        if (isnum(sig[i, k]) && (!isnum(sig[i, w]) || sig[i, k] + 0 < sig[i, w] + 0)) w = k
      if (w && isnum(sig[i, w])) o = o ",\"signalDbm\":" sig[i, w]
      if (isnum(noise[i])) o = o ",\"noiseDbm\":" noise[i]
      if (w && isnum(tx[i, w])) o = o ",\"txRateMbps\":" tx[i, w]
      if (w && isnum(rx[i, w])) o = o ",\"rxRateMbps\":" rx[i, w]
      if (type[i] ~ /^AP/) { if ((i in nsta) && !(i in stafail)) o = o ",\"clients\":" (nsta[i] + 0) }
      else if (w && mac[i, w] ~ /^[0-9a-fA-F:]+$/) o = o ",\"peerMac\":\"" tolower(mac[i, w]) "\""
      out = out (r > 1 ? "," : "") o "}"
    }
    print out "]}"
  }'
}

# POSTs file $1; sets $status to the HTTP status, or 000 when no answer came.
post() {
  : > "$TMPD/resp"
  if [ "$HTTP" = curl ]; then
    status=$(curl -sS -o "$TMPD/resp" -w '%{http_code}' -m "$PARAPET_TIMEOUT_S" \
      -H "Authorization: Bearer $PARAPET_TOKEN" -H 'Content-Type: application/json' \
      --data-binary "@$1" "$URL" 2>"$TMPD/err") || :
  else
    # shellcheck disable=SC2086 # WGET_OPTS is a list of options
    wget -q -S $WGET_OPTS -O "$TMPD/resp" --header "Authorization: Bearer $PARAPET_TOKEN" \
      --header 'Content-Type: application/json' --post-file "$1" "$URL" 2>"$TMPD/err"
    wrc=$?
    # -S prints the status line; the last one counts (after any redirect)
    status=$(awk 'match($0, /HTTP\/[0-9.]+ [0-9][0-9][0-9]/) { s = substr($0, RSTART + RLENGTH - 3, 3) } END { print s }' "$TMPD/err")
    [ -z "$status" ] && [ "$wrc" -eq 0 ] && status=200
  fi
  case $status in [1-5][0-9][0-9]) ;; *) status=000 ;; esac
}

# Sends the queue oldest first, up to BATCH_MAX a request, removing what the server
# has settled. Sets $result: 0 all delivered, 1 some left to retry, 2 some refused.
flush() {
  limit=$BATCH_MAX; result=0
  while [ -s "$QUEUE" ]; do
    head -n "$limit" "$QUEUE" > "$TMPD/chunk"
    n=$(awk 'END { print NR }' "$TMPD/chunk")
    if [ "$n" -eq 1 ]; then
      cp "$TMPD/chunk" "$TMPD/body"
    else
      awk 'BEGIN { printf "{\"reports\":[" } NR > 1 { printf "," } { printf "%s", $0 } END { print "]}" }' \
        "$TMPD/chunk" > "$TMPD/body"
    fi
    post "$TMPD/body"
    case $status in
      2??) sed "1,${n}d" "$QUEUE" > "$TMPD/q" && mv "$TMPD/q" "$QUEUE" ;;
      401|403)
        log "the server refused the token (HTTP $status): it is wrong or was revoked; download the agent again from the node's provisioning page. This report is not kept."
        sed '$d' "$QUEUE" > "$TMPD/q" && mv "$TMPD/q" "$QUEUE"
        result=2; return ;;
      400|413)
        # A batch is all-or-nothing: drop the one report the server names and resend the rest.
        bad=""
        if [ "$n" -eq 1 ]; then bad=1
        elif [ "$status" = 400 ]; then
          idx=$(sed -n 's/.*"path":"reports\.\([0-9][0-9]*\).*/\1/p' "$TMPD/resp" | head -n 1)
          [ -n "$idx" ] && [ "$idx" -lt "$n" ] && bad=$((idx + 1))
        fi
        if [ -n "$bad" ]; then
          why=$(head -c 400 "$TMPD/resp")   # busybox wget never reads an error's body
          log "the server refused report seq $(sed -n "${bad}s/^{\"seq\":\([0-9]*\).*/\1/p" "$QUEUE") (HTTP $status), dropping it${why:+: $why}"
          sed "${bad}d" "$QUEUE" > "$TMPD/q" && mv "$TMPD/q" "$QUEUE"
          result=2
        else
          limit=$(( n / 2 ))   # cannot tell which report: halve the batch until we can
        fi ;;
      000) log "could not reach $URL: $(tail -n 1 "$TMPD/err") (keeping the report to resend)"; result=1; return ;;
      *) log "the server answered HTTP $status (keeping the report to resend): $(head -c 200 "$TMPD/resp")"; result=1; return ;;
    esac
  done
}

cycle() {
  seq=$(cat "$SEQ_FILE" 2>/dev/null)
  case $seq in
    '') seq=0 ;;
    *[!0-9]*) log "$SEQ_FILE holds '$seq', not a number; counting again from 1"; seq=0 ;;
  esac
  seq=${seq#"${seq%%[!0]*}"}   # leading zeros would read as octal
  seq=$(( ${seq:-0} + 1 ))
  # Stored before sending, so a crash mid-send never reuses a seq the server may hold.
  if ! { printf '%s\n' "$seq" > "$SEQ_FILE.new" && mv "$SEQ_FILE.new" "$SEQ_FILE"; }; then
    log "could not store seq in $SEQ_FILE; it may repeat after a restart"
  fi
  had_buffer=0; [ -s "$BUFFER" ] && had_buffer=1
  # awk 1 restores a final newline a power cut may have cost the buffer
  { [ "$had_buffer" = 1 ] && awk 1 "$BUFFER"; build_report "$seq"; } > "$QUEUE"
  flush
  # Only touch the buffer file when there is something to keep or to clear.
  if [ -s "$QUEUE" ]; then
    tail -n "$PARAPET_BUFFER_MAX" "$QUEUE" > "$BUFFER.new" && mv "$BUFFER.new" "$BUFFER"
  elif [ "$had_buffer" = 1 ]; then
    : > "$BUFFER"
  fi
}

while :; do
  cycle
  [ "$once" = 1 ] && exit "$result"
  # wait, unlike a foreground sleep, lets a TERM stop the agent (and clean up) at once
  sleep "$PARAPET_INTERVAL_S" & wait $!
done
