#!/usr/bin/env bash
# npm audit for CI: fails on any high or critical advisory in the dependency tree. When the
# registry's audit endpoint cannot be reached from this machine (some mirrors answer the bulk
# advisory request with 405), there is no result to judge: say so plainly and do not fail, so a
# network limit does not pass for a clean audit or block the build.
set -uo pipefail
cd "$(dirname "$0")/.."
out="$(npm audit --json 2>/dev/null)"
node -e '
const doc = JSON.parse(process.argv[1] || "{}");
if (doc.metadata && doc.metadata.vulnerabilities) {
  const v = doc.metadata.vulnerabilities;
  console.log(`npm audit: ${v.critical ?? 0} critical, ${v.high ?? 0} high, ${v.moderate ?? 0} moderate, ${v.low ?? 0} low`);
  process.exit((v.critical ?? 0) + (v.high ?? 0) > 0 ? 1 : 0);
}
const why = doc.statusCode ? `HTTP ${doc.statusCode}` : doc.error ? String(doc.error.summary || doc.error.code || "an error") : "no answer";
console.log(`npm audit: NOT CHECKED - the registry audit endpoint is unreachable from this machine (${why}); no advisory result exists for this run`);
' "$out"
