"""Run a fixed list of commands and write what each prints, for diffing a refactor.

    python scripts/cli_snapshot.py OUTDIR        # one file per command, timings masked
    diff -r BEFORE AFTER                         # a structural change should show nothing

Timings, load and other run-dependent numbers are masked (``<t>``), so two runs of the
same code give the same files. (Commands whose route is chosen by a timing estimate,
such as ``verify --method fast`` on a high-rate code, are left out: their text may
differ between runs.) Each file holds the command, its exit status, stdout and
stderr. Uses a fresh catalog in OUTDIR/work, never the user's.
"""

from __future__ import annotations

import os
import re
import shlex
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
EX = ROOT / "examples" / "orchard-valve-link.txt"

COMMANDS = """
--help
verify --help
verify {ex}
verify --json {ex}
verify {w}/golay.json {w}/h5.txt
verify --parity-check {w}/h5.txt
verify --target-d 5 {w}/bch.json
verify {w}/missing.txt
verify {w}/bad.txt
bounds --n 24 --k 12
bounds --n 24 --k 12 --json
bounds --k 12 --d 8
bounds --n 31 --d 5
bounds --table --k 1-6 --d 3-6
bounds --n 10 --k 5 --d 4
bounds --n 0 --k 1
build --list
build hamming 4
build golay --json
build bch 31 --designed 5
build reed-muller 1 4
build repetition 0
build hamming 4 --verify
derive {w}/golay.json extend
derive {w}/golay.json shorten 0-2 --verify
derive {w}/golay.json puncture 0 --json
derive {w}/golay.json append-zeros 2
derive {w}/golay.json dual --verify --json
derive {w}/golay.json frobnicate
search --k 4 --d 3 --no-catalog --seed 1 --time-limit 20
search --n 15 --k 7 --no-catalog --seed 1 --time-limit 20
search --n 12 --d 4 --no-catalog --seed 1 --time-limit 20
search --k 4 --d 3 --no-catalog --seed 1 --time-limit 20 --json
search --k 0 --d 3
channel {w}/golay.json --p 0.01 0.001
channel {w}/golay.json --p 0.01 --json
channel {w}/h5.txt --parity-check --p 0.01 --simulate 2000 --seed 3
export {w}/golay.json --format c
export {w}/golay.json --format text
export {w}/golay.json --format json
export {w}/golay.json --format graphml
equivalent {w}/golay.json {w}/golay2.json
equivalent {w}/golay.json {w}/h5.txt --json
catalog --catalog {w}/cat.sqlite info
catalog --catalog {w}/cat.sqlite add {w}/golay.json
catalog --catalog {w}/cat.sqlite list --n 24
catalog --catalog {w}/cat.sqlite show 1
catalog --catalog {w}/cat.sqlite pick --k 12 --d 8
catalog --catalog {w}/cat.sqlite pick --n 20 --k 5
catalog --catalog {w}/cat.sqlite table --k 1-8 --d 3-8
catalog --catalog {w}/cat.sqlite --json list --n 23
catalog --catalog {w}/cat.sqlite export
catalog --catalog {w}/cat.sqlite remove 999999
gaps --catalog {w}/cat.sqlite --n 10-20
gaps --catalog {w}/cat.sqlite --n 10-20 --json
grow --catalog {w}/cat.sqlite --n 12-14 --k 3-5 --max-steps 200 --seed 2
"""

MASKS = [
    (re.compile(r"\d+(\.\d+)?(e-?\d+)? ?(s|ms|µs|us|min|h)\b"), "<t>"),
    (re.compile(r'"(seconds|\w+_s|elapsed|load|when|created|at)": [^,}\]]+'), r'"\1": <t>'),
    (re.compile(r"\d{4}-\d\d-\d\d[T ]\d\d:\d\d(:\d\d)?(\.\d+)?(Z|[+-]\d\d:\d\d)?"), "<date>"),
    (re.compile(r"load \d+(\.\d+)?"), "load <t>"),
    # work counts of threaded early-exit searches vary from run to run
    (re.compile(r"[\d,]+ (column subsets|codewords|nodes|information sets)\b"), r"<c> \1"),
]


def _prepare(w: Path) -> None:
    w.mkdir(parents=True, exist_ok=True)
    py = [sys.executable, "-m", "gf2codes"]
    subprocess.run([*py, "build", "golay", "-o", str(w / "g23.json")], check=True,
                   capture_output=True)
    subprocess.run([*py, "derive", str(w / "g23.json"), "extend", "-o", str(w / "golay.json")],
                   check=True, capture_output=True)
    subprocess.run([*py, "derive", str(w / "golay.json"), "dual", "-o", str(w / "golay2.json")],
                   check=True, capture_output=True)
    subprocess.run([*py, "build", "hamming", "5", "-o", str(w / "h5.txt")], check=True,
                   capture_output=True)
    subprocess.run([*py, "build", "bch", "63", "--designed", "5", "-o", str(w / "bch.json")],
                   check=True, capture_output=True)
    (w / "bad.txt").write_text("1101\n01x1\n")


def main(argv: list[str]) -> int:
    if len(argv) != 1:
        print(__doc__.strip().splitlines()[2].strip(), file=sys.stderr)
        return 2
    out = Path(argv[0])
    w = out / "work"
    if w.exists():  # a catalog left by an earlier run would change the outputs
        import shutil

        shutil.rmtree(w)
    _prepare(w)
    env = {**os.environ, "GF2CODES_CATALOG": str(w / "default.sqlite"), "COLUMNS": "100",
           "NO_COLOR": "1", "TERM": "dumb"}
    for i, line in enumerate(c for c in COMMANDS.strip().splitlines() if c.strip()):
        args = shlex.split(line.format(ex=EX, w=w))
        run = subprocess.run([sys.executable, "-m", "gf2codes", *args], capture_output=True,
                             text=True, env=env, cwd=w, timeout=600)
        text = (f"$ gf2codes {line}\nexit {run.returncode}\n--- stdout\n{run.stdout}"
                f"--- stderr\n{run.stderr}")
        text = text.replace(str(w), "<w>").replace(str(ROOT), "<root>")
        for pattern, repl in MASKS:
            text = pattern.sub(repl, text)
        # a table is padded to its widest cell before masking: the padding after a
        # masked time varies with the time, so fold it (and trailing blanks) away
        text = re.sub(r"<t>( +)", "<t> ", text)
        text = "\n".join(line.rstrip() for line in text.split("\n"))
        (out / f"{i:03d}.txt").write_text(text)
    print(f"{i + 1} commands written to {out}")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
