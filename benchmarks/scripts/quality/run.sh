#!/bin/sh
# Builds the harness and prints one quality table per scene (Markdown), scikit-image's RL included.
# Usage (from the repository root): benchmarks/scripts/quality/run.sh [OUT_DIR] [--no-python]
set -e
cd "$(dirname "$0")/../../.."
mvn -o -q -pl benchmarks -am package -DskipTests
exec java ${JAVA_OPTS:--Xmx2g} -cp benchmarks/target/benchmarks.jar dev.nitid.bench.quality.QualityHarness "$@"
