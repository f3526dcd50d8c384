# Test localizer: answers the first scan with a line that is not JSON.
read -r greeting
echo '{"type":"hello","name":"writes half a message","protocol":"driftlab-localizer/1"}'
while read -r line; do
  case "$line" in
    *'"type":"scan"'*)
      echo "about to answer" >&2
      echo '{"type":"estimate","pose":{"x":1.0,'
      ;;
  esac
done
