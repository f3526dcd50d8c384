# Test wrapper: records both directions of an exchange, what Driftlab writes into $1 and what the
# localizer answers into $2, and runs the localizer given by the remaining arguments in between.
to_localizer="$1"
from_localizer="$2"
shift 2
tee "$to_localizer" | "$@" | tee "$from_localizer"
