#!/usr/bin/env bash
# Rebuilds the demo traces of the invented Quillon Bay relay station from their network files.
# Each trace: 0.5 ns rise, 1 mV RMS noise with a fixed seed, so the files are repeatable.
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
cli=(dotnet run --project "$here/../../src/CableFault.Cli" --)
site=(--meta "site=Quillon Bay relay station" --meta "technician=R. Example" --meta "date=2026-11-27")
sim() { # network, output, source ohms, seed, extra...
  local network="$1" output="$2" source="$3" seed="$4"; shift 4
  "${cli[@]}" simulate "$here/$network" -o "$here/$output" --rise-time-ns 0.5 --noise-mv 1 \
      --seed "$seed" --source-ohms "$source" "${site[@]}" "$@"
}
sim mast-feeder.network.json          mast-feeder.csv          50  11 --meta "date=2025-03-14"
sim mast-feeder-damaged.network.json  mast-feeder-damaged.csv  50  12
sim mast-feeder-repaired.network.json mast-feeder-repaired.csv 50  13 --meta "date=2026-11-30"
sim mast-feeder.network.json          .vna-scratch.csv         50  14 --s1p "$here/mast-feeder-vna.s1p" --f-max-mhz 2000 --points 2000
rm -f "$here/.vna-scratch.csv"
sim camera-drop.network.json          camera-drop.csv          75  21
sim sensor-pair.network.json          sensor-pair.csv          100 31
# Two pairs of one 4-pair telemetry cable, captured in one session with the instrument set up for the cable
# (its nominal VF, Z0 and loss), as a technician compares a suspect pair against a healthy one.
pairs=(--duration-ns 1450 --meta "vf=0.68" --meta "z0=100" --meta "cable=CAT5E" --meta "date=2026-11-29")
sim sensor-cable-pair1.network.json   sensor-cable-pair1.csv   100 41 "${pairs[@]}"
sim sensor-cable-pair3.network.json   sensor-cable-pair3.csv   100 43 "${pairs[@]}"
"${cli[@]}" simulate "$here/mast-feeder-damaged.network.json" --rise-time-ns 0.5 --noise-mv 1 --seed 12 \
    -o "$here/.preview.csv" --png "$here/mast-feeder-damaged.png"
rm -f "$here/.preview.csv"
