# Test localizer: answers two scans, then writes 100 lines of error output and exits with status 3.
. "$(dirname "$0")/answer-lib.sh"
read -r greeting
echo '{"type":"hello","name":"crashes on the third scan","protocol":"driftlab-localizer/1"}'
scans=0
while read -r line; do
  case "$line" in
    *'"type":"scan"'*)
      scans=$((scans + 1))
      if [ "$scans" -eq 3 ]; then
        i=1
        while [ $i -le 100 ]; do echo "trace line $i" >&2; i=$((i + 1)); done
        echo "fatal: the map reader ran out of cells" >&2
        exit 3
      fi
      estimate "$line";;
  esac
done
