#!/usr/bin/env bash
# Starts the local stand-ins (SMTP sink, payments fake) in the background; records their PIDs.
# Sourced by start.sh and test.sh after lib.sh.

start_fakes() {
  local dir="$1"  # folder for logs, PIDs and the fakes' state files
  mkdir -p "$dir"
  SMTP_SINK_STORE="$dir/mailbox.json" SMTP_SINK_PORT="$SMTP_PORT" SMTP_SINK_HTTP_PORT="$SMTP_SINK_HTTP_PORT" \
    nohup node --import tsx "$ROOT/fakes/smtp/main.ts" >"$dir/smtp-sink.log" 2>&1 &
  echo $! >"$dir/smtp-sink.pid"
  PAYMENTS_FAKE_PORT="$PAYMENTS_API_PORT" PAYMENTS_FAKE_STATE="$dir/payments-fake.json" \
    PAYMENTS_WEBHOOK_URL="$APP_BASE_URL/api/payments/webhook" PAYMENTS_WEBHOOK_SECRET="$STRIPE_WEBHOOK_SECRET" \
    PAYMENTS_PUBLIC_URL="http://127.0.0.1:$PAYMENTS_API_PORT" \
    nohup node --import tsx "$ROOT/fakes/payments/main.ts" >"$dir/payments-fake.log" 2>&1 &
  echo $! >"$dir/payments-fake.pid"
  wait_http "http://127.0.0.1:$SMTP_SINK_HTTP_PORT/health" 60 || { cat "$dir/smtp-sink.log" >&2; return 1; }
  wait_http "http://127.0.0.1:$PAYMENTS_API_PORT/_fake/health" 60 || { cat "$dir/payments-fake.log" >&2; return 1; }
}

stop_pidfile() {
  local f="$1"
  [ -f "$f" ] || return 0
  local pid; pid="$(cat "$f")"
  kill "$pid" 2>/dev/null || true
  for _ in $(seq 20); do kill -0 "$pid" 2>/dev/null || break; sleep 0.2; done
  kill -9 "$pid" 2>/dev/null || true
  rm -f "$f"
}

stop_fakes() {
  local dir="$1"
  stop_pidfile "$dir/smtp-sink.pid"
  stop_pidfile "$dir/payments-fake.pid"
}
