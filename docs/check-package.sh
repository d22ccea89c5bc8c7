#!/bin/sh
# check-package.sh: check a vouch calc package's manifest digest and its
# signatures without vouch, using python3 and the stock ssh-keygen.
#
#   sh check-package.sh PACKAGE.html|PACKAGE.manifest.json ALLOWED_SIGNERS [REVOKED_KEYS]
#
# It reads the manifest (from the package's <pre id="manifest"> element or
# the manifest file beside it), recomputes the canonical JSON and its
# SHA-256 digest (the manifest without "signatures"), checks the results
# digest, rebuilds each standing signature's payload (six lines, each ended
# by a newline, and a checker's method of checking on up to four more lines
# before the last) and runs
#
#   ssh-keygen -Y verify -f ALLOWED_SIGNERS -I PRINCIPAL -n calc-package@vouch
#              -s SIG -Overify-time=SIGNING-TIME [-r REVOKED_KEYS] < PAYLOAD
#
# so each key is judged at its recorded signing time. It does not re-run
# the calculation: that is what vouch verify adds. Exit 0 when every
# check holds, 1 when one fails, 2 on bad usage.
set -eu

if [ $# -lt 2 ] || [ $# -gt 3 ]; then
	echo "usage: sh check-package.sh PACKAGE.html|PACKAGE.manifest.json ALLOWED_SIGNERS [REVOKED_KEYS]" >&2
	exit 2
fi
pkg=$1
signers=$2
revoked=${3:-}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

# Write the digest, and one folder per standing signature holding its
# principal, signing time, payload and signature.
python3 - "$pkg" "$work" <<'PY'
import decimal, hashlib, html, json, os, re, sys

pkg, work = sys.argv[1], sys.argv[2]
text = open(pkg, encoding="utf-8").read()
if pkg.endswith(".html"):
    m = re.search(r'<pre class="manifest" id="manifest">(.*?)</pre>', text, re.S)
    if not m:
        sys.exit("check-package: %s holds no manifest" % pkg)
    text = html.unescape(m.group(1))
manifest = json.loads(text, parse_int=float)

def number(f):
    # As Go's strconv.FormatFloat(f, 'g', -1, 64): the shortest digits
    # that read back to the same bits, in exponent form when the decimal
    # exponent is below -4 or 6 and above (1e-05, 1.5e+06), else plain.
    if f == 0:
        return "-0" if str(f).startswith("-") else "0"
    sign = "-" if f < 0 else ""
    d = decimal.Decimal(repr(abs(f))).normalize()
    digits = "".join(map(str, d.as_tuple().digits))
    dp = len(digits) + d.as_tuple().exponent
    exp = dp - 1
    if exp < -4 or exp >= 6:
        mant = digits[0] + ("." + digits[1:] if len(digits) > 1 else "")
        return "%s%se%s%02d" % (sign, mant, "-" if exp < 0 else "+", abs(exp))
    if dp <= 0:
        return sign + "0." + "0" * -dp + digits
    if dp >= len(digits):
        return sign + digits + "0" * (dp - len(digits))
    return sign + digits[:dp] + "." + digits[dp:]

def string(s):
    out = ['"']
    for ch in s:
        c = ord(ch)
        if ch in '"\\':
            out.append("\\" + ch)
        elif ch == "\n":
            out.append("\\n")
        elif ch == "\r":
            out.append("\\r")
        elif ch == "\t":
            out.append("\\t")
        elif c < 0x20 or ch in "<>&":
            out.append("\\u%04x" % c)
        else:
            out.append(ch)
    return "".join(out) + '"'

def canonical(v):
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float):
        return number(v)
    if isinstance(v, str):
        return string(v)
    if isinstance(v, list):
        return "[" + ",".join(canonical(x) for x in v) + "]"
    keys = sorted(v, key=lambda k: k.encode("utf-8"))
    return "{" + ",".join(string(k) + ":" + canonical(v[k]) for k in keys) + "}"

def sha256(s):
    return hashlib.sha256(s.encode("utf-8")).hexdigest()

body = {k: v for k, v in manifest.items() if k != "signatures"}
digest = sha256(canonical(body))
results = sha256(canonical(manifest["results"]))
if results != manifest["results_digest"]:
    print("FAIL results digest: the results digest to %s, the manifest records %s" % (results, manifest["results_digest"]))
    open(os.path.join(work, "failed"), "w").close()
print("manifest digest (sha256): " + digest)
for i, s in enumerate(manifest.get("signatures", [])):
    if s.get("withdrawn"):
        print("note %s signature of %s withdrawn %s" % (s["role"], s["principal"], s["withdrawn"]))
        continue
    payload = ("vouch-signature/1\n" + "role: " + s["role"] + "\n" +
               "signer: " + s["name"] + " <" + s["principal"] + ">\n" +
               "signed: " + s.get("signed", "") + "\n" +
               "attestation: " + s.get("attestation", "") + "\n")
    # A checker's method of checking: a line for each field that is set.
    for key, field in (("method", "method"), ("method-ref", "method_ref"),
                       ("report", "report"), ("report-sha256", "report_sha256")):
        if s.get(field):
            payload += key + ": " + s[field] + "\n"
    payload += "manifest-sha256: " + digest + "\n"
    d = os.path.join(work, "sig%d" % i)
    os.mkdir(d)
    for name, value in (("role", s["role"]), ("principal", s["principal"]),
                        ("time", re.sub(r"[-:T]", "", s.get("signed", ""))),
                        ("payload", payload), ("sig", s["signature"])):
        with open(os.path.join(d, name), "w", encoding="utf-8", newline="") as f:
            f.write(value)
PY

status=0
[ -e "$work/failed" ] && status=1
for d in "$work"/sig*; do
	[ -d "$d" ] || continue
	role=$(cat "$d/role")
	principal=$(cat "$d/principal")
	at=$(cat "$d/time")
	set -- -Y verify -f "$signers" -I "$principal" -n calc-package@vouch -s "$d/sig" -Overify-time="$at"
	if [ -n "$revoked" ]; then
		set -- "$@" -r "$revoked"
	fi
	if out=$(ssh-keygen "$@" <"$d/payload" 2>&1); then
		echo "ok   $role: $out"
	else
		echo "FAIL $role: $out"
		status=1
	fi
done
exit $status
