"""Start-up of curve commands as ratios to a bare ``python -c "import numpy, typer"``, one run.

Run:  python benchmarks/startup_benchmark.py [--before PATH] [--runs N] [--quick]

Issue 10's target: ``revolve vessel`` with ellipsoidal or torispherical heads, and
``revolve measure`` of a curve profile without ``--exact``, within 1.7× of the bare
start-up. Plain measuring imports no sympy (and no mpmath or scipy); only ``--exact``
does, so the ``--exact`` line is printed for comparison, not as a target.

Each command runs as the installed ``revolve`` script runs it (:data:`SCRIPT`: import
``revolve.cli.app`` and call its entry point), not through ``python -m``, whose module
runner a user's ``revolve`` does not load; one row gives ``python -m revolve`` for
comparison. Each command runs as a fresh process in N rounds (default 7), each run right after a
bare start-up, so that each ratio compares two runs under the same load; the median of
the rounds' ratios is printed, never as a promise (the machines are shared and noisy);
the last columns give the same ratio in CPU time (user + system) of the child processes,
which other work on the machine moves less. Byte code is compiled once first, into a
private cache (``PYTHONPYCACHEPREFIX``), so the figures are what an installed package
costs and not the compilation of its sources on every run (``PYTHONDONTWRITEBYTECODE``
is unset for the children). With ``--before PATH`` (another checkout, e.g. the main
branch before a change) its times are printed beside this checkout's. ``--quick`` (a
smoke run) is one run each and leaves out the ``--exact`` comparison (seconds of sympy).
"""

from __future__ import annotations

import argparse
import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]

#: What the ``revolve`` script that pip installs runs (``[project.scripts]``), as ``python -c``
#: (a checkout has no script of its own); an older checkout without ``run`` calls ``main``.
SCRIPT = ["-c", "import sys; from revolve.cli import app; "
                "sys.exit(getattr(app, 'run', app.main)())"]
VESSEL = ["vessel", "--diameter", "2000", "--length", "5000", "--head"]
ELLIPSOIDAL, TORISPHERICAL = VESSEL + ["ellipsoidal"], VESSEL + ["torispherical"]
COMMANDS = {
    "measure domed-lid.toml --json (a curve)":
        SCRIPT + ["measure", "{root}/profiles/domed-lid.toml", "--json"],
    "vessel, two ellipsoidal heads": SCRIPT + ELLIPSOIDAL,
    "vessel, two torispherical heads": SCRIPT + TORISPHERICAL,
    "vessel, torispherical heads, 10 mm wall": SCRIPT + TORISPHERICAL + ["--thickness", "10"],
    "vessel, ellipsoidal heads, 10 mm wall": SCRIPT + ELLIPSOIDAL + ["--thickness", "10"],
    "python -m revolve vessel, ellipsoidal heads (for comparison)": ["-m", "revolve"] + ELLIPSOIDAL,
    "measure domed-lid.toml --json --exact (for comparison)": SCRIPT + [
        "measure", "{root}/profiles/domed-lid.toml", "--json", "--exact"],
}
BARE = ["-c", "import numpy, typer"]


def run(argv, pythonpath, cwd, cache):
    env = dict(os.environ)
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    env["PYTHONPYCACHEPREFIX"] = cache
    if pythonpath is None:
        env.pop("PYTHONPATH", None)
        argv = list(argv)
    else:
        env["PYTHONPATH"] = str(pythonpath)
        argv = [a.replace("{root}", str(pythonpath)) for a in argv]
    used = resource.getrusage(resource.RUSAGE_CHILDREN)
    t0 = time.perf_counter()
    done = subprocess.run([sys.executable] + argv, cwd=cwd, env=env,
                          stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    elapsed = time.perf_counter() - t0
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    if done.returncode != 0:
        raise SystemExit(f"{' '.join(argv)} failed ({done.returncode}):\n"
                         + done.stderr.decode(errors="replace")[-2000:])
    cpu = (after.ru_utime - used.ru_utime) + (after.ru_stime - used.ru_stime)
    return elapsed, cpu


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--before", type=Path, default=None,
                    help="a checkout of the code before the change (its root directory)")
    ap.add_argument("--runs", type=int, default=7)
    ap.add_argument("--quick", action="store_true",
                    help="a smoke run: one run each, without the --exact comparison")
    args = ap.parse_args()
    commands = dict(COMMANDS)
    if args.quick:
        args.runs = 1
        commands = {k: v for k, v in commands.items() if "--exact" not in v}
    variants = {"after": ROOT}
    if args.before is not None:
        variants["before"] = args.before.resolve()

    print(f"python {sys.version.split()[0]}; {args.runs} rounds, each command a new process "
          "right after a bare start-up; ratio = median over the rounds of command / that "
          "bare start-up (target for all but the comparison rows: ≤ 1.7×)")
    ratios, bare = paired_ratios(commands, variants, args.runs)
    print(f"\nbare start-up (python -c \"import numpy, typer\"): {bare:.3f} s (median of all "
          "its runs)\n")
    header = f"{'command':58s}"
    for v in variants:
        header += f" {v:>8s} {'ratio':>6s}"
    print(header + "   CPU-time ratio" + (" (" + ", ".join(variants) + ")"))
    for name in commands:
        line = f"{name:58s}"
        for v in variants:
            wall, ratio, _ = ratios[name][v]
            line += f" {wall:7.3f}s {ratio:5.2f}×"
        line += "   " + " ".join(f"{ratios[name][v][2]:5.2f}×" for v in variants)
        print(line)


def paired_ratios(commands, variants, runs):
    """``{name: {variant: (median wall s, median wall ratio, median CPU ratio)}}``, bare median.

    ``commands`` maps a name to the arguments after ``python`` (``{root}`` is the tree's
    folder); ``variants`` maps a name to a tree whose package runs them. Byte code is
    compiled once, untimed, into a private cache; then in each of ``runs`` rounds every
    command runs right after its own bare start-up, and each ratio is taken in its pair.
    """
    with tempfile.TemporaryDirectory() as tmp:
        cache = str(Path(tmp) / "pycache")
        for path in variants.values():              # compile byte code once, untimed
            for argv in commands.values():
                run(argv, path, tmp, cache)
        run(BARE, None, tmp, cache)
        times = {name: {v: [] for v in variants} for name in commands}
        for _ in range(runs):                       # rounds: every command, each beside a bare run
            for name, argv in commands.items():
                for v, path in variants.items():
                    times[name][v].append((run(BARE, None, tmp, cache),
                                           run(argv, path, tmp, cache)))
    out = {}
    for name, by_variant in times.items():
        out[name] = {}
        for v, pairs in by_variant.items():
            out[name][v] = (statistics.median(c[0] for _, c in pairs),
                            statistics.median(c[0] / b[0] for b, c in pairs),
                            statistics.median(c[1] / b[1] for b, c in pairs))
    bare = statistics.median(b[0] for by in times.values() for pairs in by.values()
                             for b, _ in pairs)
    return out, bare

if __name__ == "__main__":
    main()
