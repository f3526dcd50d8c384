# Test localizer: answers the first scan with NaN for x.
read -r greeting
echo '{"type":"hello","name":"divides by zero","protocol":"driftlab-localizer/1"}'
while read -r line; do
  case "$line" in
    *'"type":"scan"'*)
      t=$(printf '%s' "$line" | sed 's/.*"time":\([^,}]*\).*/\1/')
      printf '{"type":"estimate","time":%s,"pose":{"x":NaN,"y":1.0,"heading":0.0}}\n' "$t";;
  esac
done
