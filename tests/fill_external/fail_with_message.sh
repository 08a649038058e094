#!/bin/sh
# Test helper: fails at once, without reading its input, with a message on
# standard error.
echo "model file weights.bin not found" >&2
echo "second line that should not be reported" >&2
exit 1
