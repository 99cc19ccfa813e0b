#!/usr/bin/env bash
# Calls the Tidewright API with a personal API token: lists the projects of the
# token's workspace, then evaluates each project's base case and prints its key
# figures. Needs curl and jq.
#
#   TIDEWRIGHT_TOKEN=tw_... TIDEWRIGHT_URL=http://127.0.0.1:3000 bash docs/api-example.sh
#
# Create the token on your account page (/app/account); a read-only token is enough.
# Figures are estimates for screening, not investment advice nor a certified yield assessment.
set -euo pipefail

: "${TIDEWRIGHT_TOKEN:?set TIDEWRIGHT_TOKEN to a personal API token from your account page}"
base="${TIDEWRIGHT_URL:-http://127.0.0.1:3000}"

api() {
	curl --silent --show-error --fail-with-body \
		-H "Authorization: Bearer ${TIDEWRIGHT_TOKEN}" -H 'Accept: application/json' "$@"
}

workspace=$(api "${base}/api/v1/workspaces" | jq -r '.workspaces[0].id')
projects=$(api "${base}/api/v1/workspaces/${workspace}/projects")
echo "Projects in $(jq -r '.workspace.name' <<<"$projects"):"
jq -r '.projects[] | "  \(.name) · \(.technology) · \(.id)"' <<<"$projects"

for project in $(jq -r '.projects[].id' <<<"$projects"); do
	# The base case, or the first live scenario when none is marked.
	scenario=$(api "${base}/api/v1/projects/${project}/scenarios" | jq -r '([.scenarios[] | select(.isBaseCase)] + .scenarios)[0].id // empty')
	[ -n "$scenario" ] || continue
	api -X POST "${base}/api/v1/scenarios/${scenario}/evaluate" | jq -r '
		"Evaluated \(.result.scenarioName // "scenario") (revision \(.revision), engine \(.engineVersion)):",
		"  LCOE, real         \(.result.metrics.lcoeReal // "n/a") \(.result.currency)/MWh",
		"  Equity IRR         \(.result.metrics.equityIrr // "n/a")",
		"  Minimum DSCR       \(.result.metrics.minDscr // "n/a")",
		"  Net annual energy  \(.result.metrics.netAepMWh // "n/a") MWh (P50)"'
done
