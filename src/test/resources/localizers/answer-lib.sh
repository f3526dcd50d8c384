# Shared by the test localizers: prints an estimate at the true start for the scan line in $1.
estimate() {
  t=$(printf '%s' "$1" | sed 's/.*"time":\([^,}]*\).*/\1/')
  printf '{"type":"estimate","time":%s,"pose":{"x":%s,"y":1.0,"heading":0.0}}\n' "$t" "${2:-2.0}"
}
