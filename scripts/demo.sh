#!/usr/bin/env bash
# Sets everything up (scripts/setup.sh), then runs the main job on the invented demo town of
# Port Ambrell: build its road graph, then the travel-time matrix, the best round trip from the
# depot and the shortest road network joining its twelve stops. Results also land in build/demo/.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh ringroad

ringroad=build/bin/ringroad
town=fixtures/demo/port-ambrell.osm
stops=fixtures/demo/stops.csv
out=build/demo
mkdir -p "$out"

echo
echo "== 1. Road graph of Port Ambrell (an invented town) =="
"$ringroad" build "$town" -o "$out/port-ambrell.rrg"
"$ringroad" info "$out/port-ambrell.rrg"

echo
echo "== 2. Travel times in seconds between the stops (rows: from, columns: to) =="
"$ringroad" matrix "$out/port-ambrell.rrg" --stops "$stops" -o "$out/matrix.csv"
cat "$out/matrix.csv"

echo
echo "== 3. Best round trip from the depot through every stop =="
"$ringroad" tour "$out/port-ambrell.rrg" --stops "$stops" -o "$out/tour.json"
"$ringroad" tour "$out/port-ambrell.rrg" --stops "$stops" --format csv 2>/dev/null
grep -E '"(total_seconds|total_meters|lower_bound|gap|proven_optimal|method)"' "$out/tour.json"
"$ringroad" tour "$out/port-ambrell.rrg" --stops "$stops" --format geojson -o "$out/tour.geojson" 2>/dev/null

echo
echo "== 4. Shortest road network joining all stops (e.g. for a cable along the roads) =="
"$ringroad" network "$out/port-ambrell.rrg" --stops "$stops" -o "$out/network.json"
grep -E '"(road_meters|link_meters_sum|saving_meters)"' "$out/network.json"
"$ringroad" network "$out/port-ambrell.rrg" --stops "$stops" --format geojson -o "$out/network.geojson"

echo
echo "Files in $out/: matrix.csv, tour.json, tour.geojson, network.json, network.geojson"
echo "Caution: travel times are estimates from map data; obey road signs and local law."
