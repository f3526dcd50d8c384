# Test localizer: speaks a protocol version Driftlab does not.
read -r greeting
echo "speaking version 2" >&2
echo '{"type":"hello","name":"from the future","protocol":"driftlab-localizer/2"}'
while read -r line; do :; done
