# pg_dump, pg_restore and psql for scripts/backup and scripts/restore: the private cluster's own
# version when PostgreSQL is installed here, else the client on PATH (e.g. inside the container).
# Source after common.sh.
pgtool() {
  local d
  if d=$(pg_bindir 2>/dev/null) && [ -x "$d/$1" ]; then echo "$d/$1"
  else command -v "$1" || die "PostgreSQL's $1 is not installed: apt-get install postgresql-client"; fi
}
