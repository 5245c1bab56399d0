#!/bin/sh
# npm run solve: the compiled command (dist/server/solve.js), built first when it is missing or a
# source is newer than the build, with the same rule as scripts/build-server.mjs. The check is
# done here with find, not by starting Node for the build script: a solve of a small model takes
# well under a second, and that start took 0.14 s of it. Run from the project's root (npm does).
stamp=dist/server/.built
for f in server evaluate.worker job-worker dense-helper.worker read-matrix.worker solve; do # its entryPoints
  [ -f "dist/server/$f.js" ] || stale=1
done
if [ ! -f "$stamp" ] || [ -n "${stale:-}" ] || [ -n "$(find api core scripts/solve.ts scripts/build-server.mjs package-lock.json \
  -newer "$stamp" \( -name '*.ts' -o -name '*.mjs' -o -name '*.json' \) -print -quit 2>/dev/null)" ]; then
  node scripts/build-server.mjs --quiet || exit $?
fi
exec node dist/server/solve.js "$@"
