# Test localizer: answers every scan with a fixed pose, one hypothesis without a covariance, and no
# particles or figures.
read -r greeting
echo '{"type":"hello","name":"stands still","protocol":"driftlab-localizer/1"}'
while read -r line; do
  case "$line" in
    *'"type":"scan"'*)
      t=$(printf '%s' "$line" | sed 's/.*"time":\([^,}]*\).*/\1/')
      printf '{"type":"estimate","time":%s,"pose":{"x":2.0,"y":1.0,"heading":0.0},"hypotheses":[{"weight":1.0,"pose":{"x":2.0,"y":1.0,"heading":0.0}}]}\n' "$t";;
    *'"type":"end"'*) exit 0;;
  esac
done
