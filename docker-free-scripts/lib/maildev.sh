# shellcheck shell=bash
# The local mail fake (maildev from node_modules), SMTP and web inbox both on 127.0.0.1.
# Sourced after lib/common.sh.

maildev_start() {
  local pidfile=$1 log=$2 smtp_port=$3 web_port=$4 port
  for port in "$smtp_port" "$web_port"; do
    if port_busy "$port"; then
      die "port $port on 127.0.0.1 is taken by another program; the mail fake needs it (choose other ports with PARAPET_SMTP_PORT / PARAPET_MAIL_WEB_PORT)"
    fi
  done
  say "starting the mail fake (SMTP 127.0.0.1:$smtp_port, inbox http://127.0.0.1:$web_port, log: $log)"
  spawn_service "$pidfile" "$log" "$PARAPET_ROOT/node_modules/.bin/maildev" \
    --ip 127.0.0.1 --smtp "$smtp_port" --web-ip 127.0.0.1 --web "$web_port"
  wait_until "the mail fake's SMTP port $smtp_port" 60 "$SPAWNED_PID" "$log" port_busy "$smtp_port"
  wait_until "the mail fake's inbox port $web_port" 30 "$SPAWNED_PID" "$log" port_busy "$web_port"
}
