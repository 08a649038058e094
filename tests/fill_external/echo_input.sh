#!/bin/sh
# Test helper: streams its input back line by line as it reads it (gaps stay
# empty), so that reading and writing overlap on a large series.
exec cat
