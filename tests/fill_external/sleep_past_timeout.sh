#!/bin/sh
# Test helper: starts a background sleeper (its process id written to the
# file named by the first argument) and waits far longer than any test
# timeout, so the harness has to kill the whole process group.
sleep 30 &
echo $! > "$1"
wait
