# Test localizer: answers every scan with a fixed pose and no particles, covariance or figures.
. "$(dirname "$0")/answer-lib.sh"
read -r greeting
echo '{"type":"hello","name":"stands still","protocol":"driftlab-localizer/1"}'
while read -r line; do
  case "$line" in
    *'"type":"scan"'*) estimate "$line";;
    *'"type":"end"'*) exit 0;;
  esac
done
