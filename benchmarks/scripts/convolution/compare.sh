#!/usr/bin/env bash
# Times the same same-size convolution (REFLECT boundary, box PSF) with Nitid, scipy.fft and FFTW,
# back to back in one session, and prints the ratios. Best of REPS calls per tool, ROUNDS rounds
# interleaved (best kept), so that load from other processes hits every tool alike.
#
# Usage: benchmarks/scripts/convolution/compare.sh [WIDTH HEIGHT PSF THREADS REPS ROUNDS]
# Needs: java 17, the benchmarks jar (built here if missing), python3 with scipy, gcc and
# Debian libfftw3-dev (fftw3f and fftw3f_threads).
set -euo pipefail
W=${1:-4096}; H=${2:-4096}; P=${3:-31}; T=${4:-2}; REPS=${5:-5}; ROUNDS=${6:-2}
HERE=$(cd "$(dirname "$0")" && pwd)
ROOT=$(cd "$HERE/../../.." && pwd)
JAR="$ROOT/benchmarks/target/benchmarks.jar"
WORK=$(mktemp -d)
trap 'rm -rf "$WORK"' EXIT

if [ ! -f "$JAR" ]; then
  (cd "$ROOT" && mvn -o -q -pl benchmarks -am package -DskipTests)
fi
export OMP_WAIT_POLICY=PASSIVE  # waiting OpenMP threads sleep instead of spinning on a shared machine
gcc -O3 -march=native -fopenmp "$HERE/fftw_conv.c" -o "$WORK/fftw_conv" -lfftw3f_threads -lfftw3f -lm

best() { # keeps the smaller best_ms of two result lines
  awk -v a="$1" -v b="$2" 'BEGIN{ if (a == "" ) {print b; exit} split(a,x," "); split(b,y," ");
    for(i in x) if (x[i]=="best_ms") ia=i+1; for(i in y) if (y[i]=="best_ms") ib=i+1;
    if (y[ib] + 0 < x[ia] + 0) print b; else print a }'
}
ms() { awk '{for(i=1;i<=NF;i++) if($i=="best_ms") print $(i+1)}' <<<"$1"; }
cpu() { awk '{for(i=1;i<=NF;i++) if($i=="cpu_ms") print $(i+1)}' <<<"$1"; }

echo "# $(date -u +%FT%TZ) $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg); ${W}x${H}, PSF ${P}x${P}, ${T} threads"
NT=""; NW=""; SW=""; FW=""; FT=""
for r in $(seq "$ROUNDS"); do
  NT=$(best "$NT" "$(java -Xmx3g -cp "$JAR" dev.nitid.bench.fft.ConvolveTiming "$W" "$H" "$P" "$T" TILED "$REPS")")
  TILE=$(awk '{for(i=1;i<=NF;i++) if($i=="fft") {split($(i+1),a,"x"); print a[1]}}' <<<"$NT")
  NW=$(best "$NW" "$(java -Xmx3g -cp "$JAR" dev.nitid.bench.fft.ConvolveTiming "$W" "$H" "$P" "$T" WHOLE_PLANE "$REPS")")
  SW=$(best "$SW" "$(python3 "$HERE/scipy_conv.py" "$W" "$H" "$P" "$T" "$REPS")")
  FW=$(best "$FW" "$("$WORK/fftw_conv" "$W" "$H" "$P" whole "$T" "$REPS")")
  FT=$(best "$FT" "$("$WORK/fftw_conv" "$W" "$H" "$P" tiled "$T" "$REPS" "$TILE")")
done
printf '%s\n' "$NT" "$NW" "$SW" "$FW" "$FT"
awk -v nt="$(ms "$NT")" -v nw="$(ms "$NW")" -v sw="$(ms "$SW")" -v fw="$(ms "$FW")" -v ft="$(ms "$FT")" 'BEGIN{
  nb = nt < nw ? nt : nw;
  printf "ratio nitid(best path)/scipy.fft      %.2f   (target <= 1)\n", nb / sw;
  printf "ratio nitid tiled/fftw tiled          %.2f   (target <= 2, moonshot 1.3)\n", nt / ft;
  printf "ratio nitid whole/fftw whole          %.2f\n", nw / fw;
  printf "ratio nitid(best path)/fftw(best path) %.2f\n", nb / (ft < fw ? ft : fw);
}'
# CPU time (all threads) per call: the work done, less sensitive than wall time to a busy machine.
awk -v nt="$(cpu "$NT")" -v nw="$(cpu "$NW")" -v sw="$(cpu "$SW")" -v fw="$(cpu "$FW")" -v ft="$(cpu "$FT")" 'BEGIN{
  printf "cpu ratio nitid tiled/scipy.fft     %.2f\n", nt / sw;
  printf "cpu ratio nitid tiled/fftw tiled    %.2f\n", nt / ft;
  printf "cpu ratio nitid whole/fftw whole    %.2f\n", nw / fw;
}'
