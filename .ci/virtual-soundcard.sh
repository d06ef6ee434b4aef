#!/usr/bin/env bash
# A virtual sound card for the end-to-end audio tests: a private PulseAudio server with a null sink
# "loop" (48 kHz, 2 channels, s16le) whose monitor is the default capture source, and ALSA (which
# Java Sound uses on Linux) pointed at that server. What is played to the default output comes back,
# bit for bit, on the default input.
#
#   .ci/virtual-soundcard.sh start   install the packages if missing, start the server (idempotent)
#   .ci/virtual-soundcard.sh stop    stop the server started here, by its PID
#   .ci/virtual-soundcard.sh env     print the environment file's path; source it before starting a JVM
#   .ci/virtual-soundcard.sh status  exit 0 if the server answers
#
# Everything lives in one private folder, $ROSEATE_SOUNDCARD_DIR (default /tmp/roseate-soundcard-$UID):
# the server's runtime folder (XDG_RUNTIME_DIR), its .pa script, the ALSA configuration, the PID, the
# log and the env file. Nothing outside it is touched except the Debian packages.
set -euo pipefail

DIR="${ROSEATE_SOUNDCARD_DIR:-/tmp/roseate-soundcard-$(id -u)}"
RUNTIME="$DIR/runtime"
PA_FILE="$DIR/roseate.pa"
ALSA_FILE="$DIR/asound.conf"
CLIENT_FILE="$DIR/client.conf"
PID_FILE="$DIR/pulseaudio.pid"
LOG_FILE="$DIR/pulseaudio.log"
ENV_FILE="$DIR/env"
PACKAGES=(pulseaudio pulseaudio-utils libasound2-plugins alsa-utils)

log() { echo "virtual-soundcard: $*" >&2; }

install_packages() {
    local missing=()
    for p in "${PACKAGES[@]}"; do
        dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q 'install ok installed' || missing+=("$p")
    done
    if [ "${#missing[@]}" -eq 0 ]; then
        return
    fi
    log "installing ${missing[*]}"
    local sudo=()
    if [ "$(id -u)" -ne 0 ]; then
        sudo=(sudo -n)
    fi
    "${sudo[@]}" apt-get update -qq
    DEBIAN_FRONTEND=noninteractive "${sudo[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
}

write_files() {
    mkdir -p "$DIR" "$RUNTIME"
    chmod 700 "$DIR" "$RUNTIME"
    # The keep-alive: a second null sink fed from loop's monitor. Without a permanent reader the
    # monitor's clock jumps (by up to two seconds in trials) when capture starts; suspending and
    # resuming loop once after the loopback is up settles its timing.
    cat >"$PA_FILE" <<'EOF'
.fail
load-module module-native-protocol-unix auth-anonymous=1
load-module module-null-sink sink_name=loop rate=48000 channels=2 format=s16le sink_properties=device.description=roseate-loop
load-module module-null-sink sink_name=keepalive rate=48000 channels=2 format=s16le sink_properties=device.description=roseate-keepalive
load-module module-loopback source=loop.monitor sink=keepalive latency_msec=10
set-default-sink loop
set-default-source loop.monitor
suspend-sink loop 1
suspend-sink loop 0
EOF
    cat >"$ALSA_FILE" <<'EOF'
pcm.!default pulse
ctl.!default pulse
EOF
    # Never let a client start a second server of its own.
    cat >"$CLIENT_FILE" <<'EOF'
autospawn = no
EOF
    cat >"$ENV_FILE" <<EOF
export XDG_RUNTIME_DIR='$RUNTIME'
export PULSE_RUNTIME_PATH='$RUNTIME/pulse'
export PULSE_SERVER='unix:$RUNTIME/pulse/native'
export PULSE_CLIENTCONFIG='$CLIENT_FILE'
export ALSA_CONFIG_PATH='/usr/share/alsa/alsa.conf:$ALSA_FILE'
export ROSEATE_VIRTUAL_SOUNDCARD=1
EOF
}

running_pid() {
    if [ -f "$PID_FILE" ]; then
        local pid
        pid="$(cat "$PID_FILE")"
        if [ -n "$pid" ] && kill -0 "$pid" 2>/dev/null; then
            echo "$pid"
            return 0
        fi
    fi
    return 1
}

answers() {
    # shellcheck disable=SC1090
    (source "$ENV_FILE" && pactl info >/dev/null 2>&1)
}

start() {
    install_packages
    if pid="$(running_pid)" && answers; then
        log "already running (PID $pid); env in $ENV_FILE"
        return
    fi
    write_files
    rm -f "$PID_FILE"
    (
        # shellcheck disable=SC1090
        source "$ENV_FILE"
        # -n: no default.pa; -F: our script; no shared memory (containers often lack it); never exit
        # when idle. Root is allowed (with a warning) because CI containers run as root.
        nohup pulseaudio -n -F "$PA_FILE" --daemonize=no --disable-shm=yes --exit-idle-time=-1 \
            --log-target=stderr >"$LOG_FILE" 2>&1 &
        echo $! >"$PID_FILE"
    )
    for _ in $(seq 1 100); do
        if answers; then
            # shellcheck disable=SC1090
            (source "$ENV_FILE" && pactl list short sinks | grep -q '^[0-9]*[[:space:]]loop[[:space:]]') || break
            log "started (PID $(cat "$PID_FILE")); source $ENV_FILE"
            return
        fi
        if ! running_pid >/dev/null; then
            break
        fi
        sleep 0.1
    done
    log "the server did not come up; its log ($LOG_FILE):"
    tail -n 20 "$LOG_FILE" >&2 || true
    stop
    exit 1
}

stop() {
    local pid
    if pid="$(running_pid)"; then
        kill "$pid" 2>/dev/null || true
        for _ in $(seq 1 50); do
            kill -0 "$pid" 2>/dev/null || break
            sleep 0.1
        done
        if kill -0 "$pid" 2>/dev/null; then
            kill -9 "$pid" 2>/dev/null || true
        fi
        log "stopped (PID $pid)"
    fi
    rm -f "$PID_FILE"
}

case "${1:-}" in
    start) start ;;
    stop) stop ;;
    env)
        [ -f "$ENV_FILE" ] || write_files
        echo "$ENV_FILE"
        ;;
    status) running_pid >/dev/null && answers ;;
    *)
        echo "usage: $0 start|stop|env|status" >&2
        exit 2
        ;;
esac
