#!/bin/sh
# A one-node Slurm cluster on localhost, for the job-array integration test
# (integration/slurm/slurm_test.go) and for trying the job-array example
# (examples/slurm/) by hand. Debian 12 packages slurm-wlm (22.05) and
# munge; run as root, no systemd needed.
#
#   scripts/slurm-local.sh install [--no-update]
#                                      apt-get update (unless --no-update), then install
#                                      slurm-wlm and munge
#   scripts/slurm-local.sh start DIR   munge key and munged, DIR/slurm.conf, slurmctld, slurmd;
#                                      waits until the node is idle
#   scripts/slurm-local.sh stop DIR    stops what start started, by the PIDs in its pid files
#   scripts/slurm-local.sh env DIR     prints the export line for SLURM_CONF
#
# After start, every Slurm command needs SLURM_CONF=DIR/slurm.conf in its
# environment (eval "$(scripts/slurm-local.sh env DIR)"). The steps follow
# the checked recipe in the project notes: munge key of 1024 random bytes
# (munge:munge, mode 400), munged run as the munge user, a slurm.conf with
# the host name from `hostname` and the CPUs from `nproc`, state, spool and
# logs under DIR. start leaves an existing munged (and its key) alone; stop
# ends only the daemons start launched. The daemons' logs are DIR/log/.
set -eu

usage() {
	echo "usage: $0 install [--no-update] | start DIR | stop DIR | env DIR" >&2
	exit 2
}

need_root() {
	if [ "$(id -u)" -ne 0 ]; then
		echo "slurm-local: $1 needs root (the daemons run as root on this one-node cluster)" >&2
		exit 1
	fi
}

# munge_ok reports whether a munged answers: a credential made by munge
# must decode.
munge_ok() {
	command -v munge >/dev/null 2>&1 && munge -n 2>/dev/null | unmunge 2>/dev/null | grep -q 'STATUS: *Success'
}

install_packages() {
	need_root install
	export DEBIAN_FRONTEND=noninteractive
	if [ "${1:-}" != "--no-update" ]; then
		apt-get update
	fi
	apt-get install -y --no-install-recommends slurm-wlm munge
}

start_cluster() {
	need_root start
	for b in munged slurmctld slurmd sinfo sbatch; do
		if ! command -v "$b" >/dev/null 2>&1 && [ ! -x "/usr/sbin/$b" ]; then
			echo "slurm-local: $b not found; run '$0 install' first" >&2
			exit 1
		fi
	done
	mkdir -p "$dir/state" "$dir/spool" "$dir/log"

	# 1. munge: key, run directory, daemon, and a credential round trip.
	if munge_ok; then
		echo "slurm-local: munged already running; using it"
	else
		mkdir -p /etc/munge
		dd if=/dev/urandom of=/etc/munge/munge.key bs=1024 count=1 2>/dev/null
		chown munge:munge /etc/munge/munge.key
		chmod 400 /etc/munge/munge.key
		mkdir -p /run/munge && chown munge:munge /run/munge
		runuser -u munge -- /usr/sbin/munged --force
		i=0
		until munge_ok; do
			i=$((i + 1))
			if [ "$i" -gt 50 ]; then
				echo "slurm-local: munge -n | unmunge does not say STATUS: Success" >&2
				exit 1
			fi
			sleep 0.1
		done
		# munged writes its PID here; stop ends it only because we started it.
		cp /run/munge/munged.pid "$dir/munged.pid"
	fi

	# 2. slurm.conf for this host.
	host=$(hostname)
	cpus=$(nproc)
	cat >"$dir/slurm.conf" <<EOF
ClusterName=local
SlurmctldHost=$host
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
StateSaveLocation=$dir/state
SlurmdSpoolDir=$dir/spool
SlurmctldPidFile=$dir/slurmctld.pid
SlurmdPidFile=$dir/slurmd.pid
SlurmctldLogFile=$dir/log/ctld.log
SlurmdLogFile=$dir/log/d.log
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
SchedulerType=sched/backfill
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
ReturnToService=2
MpiDefault=none
JobAcctGatherType=jobacct_gather/none
NodeName=$host CPUs=$cpus RealMemory=4000 State=UNKNOWN
PartitionName=debug Nodes=$host Default=YES MaxTime=INFINITE State=UP
EOF
	export SLURM_CONF="$dir/slurm.conf"

	# 3. the controller and the node daemon (both daemonise).
	slurmctld -f "$SLURM_CONF"
	slurmd -f "$SLURM_CONF"
	i=0
	until sinfo -h -o '%t' 2>/dev/null | grep -qx 'idle'; do
		i=$((i + 1))
		if [ "$i" -gt 300 ]; then
			echo "slurm-local: the node is not idle after 30 s; sinfo says:" >&2
			sinfo >&2 || true
			echo "slurm-local: logs in $dir/log" >&2
			exit 1
		fi
		sleep 0.1
	done
	echo "slurm-local: one-node cluster up ($host, $cpus CPUs); export SLURM_CONF=$SLURM_CONF"
}

stop_cluster() {
	# 5. by the PIDs in the pid files, never by name.
	for f in "$dir/slurmd.pid" "$dir/slurmctld.pid" "$dir/munged.pid"; do
		pid=$(cat "$f" 2>/dev/null || true)
		if [ -n "$pid" ] && kill -0 "$pid" 2>/dev/null; then
			kill "$pid"
			i=0
			while kill -0 "$pid" 2>/dev/null && [ "$i" -lt 100 ]; do
				i=$((i + 1))
				sleep 0.1
			done
		fi
		rm -f "$f"
	done
	echo "slurm-local: stopped"
}

[ $# -ge 1 ] || usage
cmd=$1
shift
case $cmd in
install) install_packages "$@" ;;
start | stop | env)
	[ $# -eq 1 ] || usage
	mkdir -p "$1"
	dir=$(cd "$1" && pwd)
	case $cmd in
	start) start_cluster ;;
	stop) stop_cluster ;;
	env) echo "export SLURM_CONF=$dir/slurm.conf" ;;
	esac
	;;
*) usage ;;
esac
