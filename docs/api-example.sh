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

# Lists come a page at a time: each page's nextCursor goes back as ?cursor= until it is null.
every_page() {
	local url="$1" cursor='' page
	while :; do
		page=$(api "${url}?limit=500${cursor:+&cursor=${cursor}}")
		jq -c '.' <<<"$page"
		cursor=$(jq -r '.nextCursor // empty' <<<"$page")
		[ -n "$cursor" ] || break
	done
}

workspace=$(api "${base}/api/v1/workspaces" | jq -r '.workspaces[0].id')
projects=$(every_page "${base}/api/v1/workspaces/${workspace}/projects" | jq -s '{ workspace: .[0].workspace, projects: (map(.projects) | add) }')
echo "Projects in $(jq -r '.workspace.name' <<<"$projects"):"
jq -r '.projects[] | "  \(.name) · \(.technology) · \(.id)"' <<<"$projects"

# The API gives every figure as an exact decimal string; jq rounds them here for reading only.
figures='def shown(p): if . == null then "n/a" else (tonumber * pow(10; p) | round) / pow(10; p) | tostring end;
	def percent: if . == null then "n/a" else (tonumber * 100 | shown(2)) + " %" end;
	"  \(.result.scenarioName), revision \(.revision) (engine \(.engineVersion)):",
	"    LCOE, real               \(.result.metrics.lcoeReal | shown(2)) \(.result.currency)/MWh",
	"    Equity IRR               \(.result.metrics.equityIrr | percent)",
	"    Minimum DSCR             \(.result.metrics.minDscr | shown(2))",
	"    Net annual energy, P50   \(.result.metrics.netAepMWh | shown(0)) MWh/yr"'

jq -r '.projects[] | "\(.id)\t\(.name)"' <<<"$projects" | while IFS=$'\t' read -r project name; do
	# The base case (listed first), or the first live scenario when none is marked.
	scenario=$(api "${base}/api/v1/projects/${project}/scenarios" | jq -r '([.scenarios[] | select(.isBaseCase)] + .scenarios)[0].id // empty')
	if [ -z "$scenario" ]; then
		echo "${name}: no scenarios yet"
		continue
	fi
	echo "${name}:"
	api -X POST "${base}/api/v1/scenarios/${scenario}/evaluate" | jq -r "$figures"
done
