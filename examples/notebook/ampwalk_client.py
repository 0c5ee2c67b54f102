"""Python client for the ampwalk JSON-lines bridge.

Standard library only; when numpy is importable, numeric lists in the
responses become numpy arrays. The bridge is the Go program in
examples/bridge; the job format is ../shared/spec/job-format.md plus the
extensions documented in examples/notebook/README.md.

    from ampwalk_client import Bridge, AmpwalkError

    with Bridge() as b:                      # builds the bridge with `go build`
        r = b.run({"lattice": {"kind": "gasket", "generation": 6},
                   "start": {"near": [0, 0]},
                   "times": {"from": 0.1, "to": 100, "count": 40, "spacing": "log"},
                   "report": ["msd", "regimes"]})
        print(r["msd"][-1], r["regimes"])

A request that fails raises AmpwalkError carrying .code, .field, .message
and .id (run_many can return the errors in place instead).
"""

import json
import os
import shutil
import subprocess
import tempfile
import threading

try:  # numpy is optional
    import numpy as _np
except ImportError:  # pragma: no cover - depends on the machine
    _np = None

__all__ = ["Bridge", "AmpwalkError", "build_bridge", "HAVE_NUMPY"]

HAVE_NUMPY = _np is not None

_HERE = os.path.dirname(os.path.abspath(__file__))
_REPO = os.path.dirname(os.path.dirname(_HERE))


class AmpwalkError(Exception):
    """An error line of the bridge: code, field, message and the request id."""

    def __init__(self, code, field, message, id=""):
        super().__init__("%s%s: %s" % (code, " (%s)" % field if field else "", message))
        self.code = code
        self.field = field
        self.message = message
        self.id = id


def build_bridge(directory=None, repo=_REPO, go="go"):
    """Build examples/bridge with `go build` into directory (a new temporary
    directory when None) and return the path of the binary."""
    if shutil.which(go) is None:
        raise RuntimeError("the go command is not on PATH; pass the path of a built bridge instead")
    directory = directory or tempfile.mkdtemp(prefix="ampwalk-")
    out = os.path.join(directory, "ampwalk-bridge")
    subprocess.run([go, "build", "-o", out, "./examples/bridge"], cwd=repo, check=True)
    return out


def _is_number(x):
    return isinstance(x, (int, float)) and not isinstance(x, bool)


def _arrays(value):
    """Turn lists of numbers (and lists of such lists) into numpy arrays."""
    if isinstance(value, dict):
        return {k: _arrays(v) for k, v in value.items()}
    if isinstance(value, list):
        if value and all(_is_number(x) for x in value):
            return _np.asarray(value, dtype=float)
        if value and all(isinstance(x, list) and x and all(_is_number(y) for y in x) for x in value):
            try:
                return _np.asarray(value, dtype=float)
            except ValueError:
                return [_np.asarray(x, dtype=float) for x in value]
        return [_arrays(x) for x in value]
    return value


class Bridge:
    """A running bridge process.

    path: the bridge binary; when None, $AMPWALK_BRIDGE if set, otherwise the
    bridge is built from this repository with `go build` into a temporary
    directory. log: where the bridge's progress goes (a file object, or
    subprocess.DEVNULL; None inherits this process's stderr). arrays: convert
    numeric lists to numpy arrays (default: when numpy is importable).
    """

    def __init__(self, path=None, log=None, arrays=None, env=None):
        self._tmp = None
        if path is None:
            path = os.environ.get("AMPWALK_BRIDGE")
        if path is None:
            self._tmp = tempfile.mkdtemp(prefix="ampwalk-")
            path = build_bridge(self._tmp)
        self.path = path
        self.arrays = HAVE_NUMPY if arrays is None else (arrays and HAVE_NUMPY)
        self._proc = subprocess.Popen([path], stdin=subprocess.PIPE, stdout=subprocess.PIPE,
                                      stderr=log, env=env, bufsize=1 << 16)
        self._lock = threading.Lock()
        self._count = 0

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()
        return False

    def _line(self, job):
        if isinstance(job, (bytes, str)):  # a raw line, sent as is
            text = job.encode() if isinstance(job, str) else job
            return text.replace(b"\n", b" ") + b"\n"
        return json.dumps(job, allow_nan=False).encode() + b"\n"

    def _decode(self, raw):
        if not raw:
            code = self._proc.poll()
            raise RuntimeError("the bridge stopped without answering (exit status %s)" % code)
        resp = json.loads(raw)
        if "error" in resp:
            e = resp["error"]
            return AmpwalkError(e.get("code", ""), e.get("field", ""), e.get("message", ""), resp.get("id", ""))
        return _arrays(resp) if self.arrays else resp

    def run(self, job):
        """Send one job (a dict, or a raw JSON line) and return the response
        dict; raise AmpwalkError for an error line."""
        with self._lock:
            self._proc.stdin.write(self._line(job))
            self._proc.stdin.flush()
            out = self._decode(self._proc.stdout.readline())
        if isinstance(out, AmpwalkError):
            raise out
        return out

    def run_many(self, jobs, raise_errors=False):
        """Send several jobs at once (written from a helper thread, so large
        batches cannot deadlock on the pipes) and return the responses in
        order; failed requests appear as AmpwalkError objects unless
        raise_errors, which raises the first."""
        jobs = list(jobs)
        lines = [self._line(j) for j in jobs]
        with self._lock:
            def feed():
                for ln in lines:
                    self._proc.stdin.write(ln)
                self._proc.stdin.flush()

            writer = threading.Thread(target=feed, daemon=True)
            writer.start()
            out = [self._decode(self._proc.stdout.readline()) for _ in lines]
            writer.join()
        if raise_errors:
            for r in out:
                if isinstance(r, AmpwalkError):
                    raise r
        return out

    def close(self):
        """Close the bridge's input and wait for it to exit; return its exit
        status (0 at the end of input)."""
        if self._proc.poll() is None:
            try:
                self._proc.stdin.close()
            except OSError:
                pass
            self._proc.wait()
        self._proc.stdout.close()
        if self._tmp:
            shutil.rmtree(self._tmp, ignore_errors=True)
            self._tmp = None
        return self._proc.returncode
