# Test localizer: says hello, answers one scan, then sleeps (in a child process that holds the pipes).
. "$(dirname "$0")/answer-lib.sh"
read -r greeting
echo '{"type":"hello","name":"hangs on the second scan","protocol":"driftlab-localizer/1"}'
scans=0
while read -r line; do
  case "$line" in
    *'"type":"scan"'*)
      scans=$((scans + 1))
      if [ "$scans" -eq 2 ]; then
        echo "thinking very hard" >&2
        sleep 600
      fi
      estimate "$line";;
  esac
done
