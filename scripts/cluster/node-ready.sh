#!/bin/sh
# HAProxy's health check for a Galera node (external-check; HAProxy passes the proxy's address
# and port, then the node's address and port). A node takes connections only while it is
# Synced (wsrep_local_state 4) and ready for statements; a joining, donating or cut-off node
# is taken out of rotation, and its open sessions are shut so the app reconnects elsewhere.
status=$(mariadb --no-defaults --protocol=TCP -h "$3" -P "$4" -u ingotrace_check --connect-timeout=1 -N -B \
  -e "SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_local_state', 'wsrep_ready')" 2>/dev/null) || exit 1
printf '%s\n' "$status" | grep -q '^wsrep_local_state[[:space:]]4$' || exit 1
printf '%s\n' "$status" | grep -q '^wsrep_ready[[:space:]]ON$' || exit 1
exit 0
