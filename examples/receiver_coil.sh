#!/usr/bin/env bash
# Invented scenario: a 40 µH coil for a simple shortwave receiver's tuned circuit, wound on an
# offcut of 32 mm plumbing pipe (outside diameter) with 0.4 mm enamelled copper wire.
set -euo pipefail
coilplan=${COILPLAN:-$(command -v coilplan || echo .venv/bin/coilplan)}

echo "# 1. How many turns for 40 µH, close wound?"
"$coilplan" solenoid --former 32mm --wire 0.4mm --target 40uH --lead 40mm

echo
echo "# 2. Only 50 mm of the pipe is free between the mounting holes: does it fit?"
"$coilplan" solenoid --former 32mm --wire 0.4mm --target 40uH --max-length 50mm

echo
echo "# 3. The reel on the shelf is 26 AWG instead: the same coil, as JSON for a script."
"$coilplan" solenoid --former 32mm --wire 26awg --target 40uH --json
