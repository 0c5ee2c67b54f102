"""Tests of the Python client against the real bridge (standard library only).

Run with examples/notebook/run_client_test.sh, which builds the bridge once
and passes it in $AMPWALK_BRIDGE; without it the client builds the bridge
itself (the go command must be on PATH).
"""

import math
import os
import subprocess
import sys
import unittest

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))

import ampwalk_client as ac  # noqa: E402


def as_list(x):
    return [float(v) for v in x]


class ClientTest(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.bridge = ac.Bridge(log=subprocess.DEVNULL)

    @classmethod
    def tearDownClass(cls):
        status = cls.bridge.close()
        # The contract: the bridge exits 0 at end of input, even after errors.
        assert status == 0, "bridge exit status %s" % status

    def test_chain_msd_and_return(self):
        # Infinite line: MSD = 2t², p0(t=1) = J_0(2)² = 0.0501270809844695
        # (Childs, Farhi, Gutmann, Quantum Inf. Process. 1, 35 (2002), from
        # memory; check value from the project's references.md).
        r = self.bridge.run({"id": "chain", "lattice": {"kind": "chain", "sites": 201},
                             "start": {"site": 100}, "times": [0, 0.5, 1, 2, 4],
                             "tolerance": 1e-12})
        self.assertEqual(r["id"], "chain")
        self.assertEqual(r["sites"], 201)
        self.assertEqual(r["bonds"], 200)
        for t, m in zip(as_list(r["times"]), as_list(r["msd"])):
            self.assertAlmostEqual(m, 2 * t * t, delta=1e-8 * max(1, t * t))
        self.assertAlmostEqual(as_list(r["return"])[2], 0.0501270809844695, delta=1e-10)
        self.assertIn("method", r["diagnostics"])

    def test_error_raises(self):
        with self.assertRaises(ac.AmpwalkError) as cm:
            self.bridge.run({"id": "typo", "lattice": {"kind": "gasket", "generaton": 3},
                             "start": {"site": 0}, "times": [1]})
        e = cm.exception
        self.assertEqual(e.code, "unknown-field")
        self.assertEqual(e.field, "lattice.generaton")
        self.assertEqual(e.id, "typo")
        self.assertTrue(e.message)
        with self.assertRaises(ac.AmpwalkError) as cm:
            self.bridge.run("this is not json")
        self.assertEqual(cm.exception.code, "malformed")
        # The bridge is still alive after errors.
        r = self.bridge.run({"lattice": {"kind": "gasket", "generation": 2},
                             "start": {"near": [0, 0]}, "times": [0.5]})
        self.assertEqual(r["sites"], 15)  # (3^3 + 3)/2, references.md

    def test_run_many_order(self):
        jobs = [{"id": "j%d" % k, "lattice": {"kind": "square", "width": 5, "height": 4},
                 "start": {"site": k}, "times": [1]} for k in range(8)]
        jobs.insert(3, {"id": "bad", "lattice": {"kind": "square", "width": 5, "height": 4},
                        "start": {"site": 99}, "times": [1]})
        out = self.bridge.run_many(jobs)
        self.assertEqual(len(out), 9)
        self.assertIsInstance(out[3], ac.AmpwalkError)
        self.assertEqual(out[3].code, "invalid")
        self.assertEqual(out[3].field, "start.site")
        self.assertEqual([o["id"] for k, o in enumerate(out) if k != 3], ["j%d" % k for k in range(8)])

    def test_series_and_times_range(self):
        ts = [0.1 * 10 ** (k / 10) for k in range(41)]
        ys = [t ** 2 if t <= 10 else 100 * (t / 10) ** 0.86 for t in ts]
        r = self.bridge.run({"id": "m1", "series": {"times": ts, "values": ys},
                             "report": ["regimes"], "fit": {"segments": 3}})
        self.assertEqual(len(r["regimes"]), 2)
        self.assertAlmostEqual(r["regimes"][0]["exponent"], 2, delta=1e-6)
        self.assertAlmostEqual(r["regimes"][1]["exponent"], 0.86, delta=1e-6)
        self.assertAlmostEqual(r["crossovers"][0]["time"], 10, delta=1e-3)
        r = self.bridge.run({"lattice": {"kind": "chain", "sites": 9}, "start": {"site": 4},
                             "times": {"from": 0.01, "to": 100, "count": 5, "spacing": "log"}})
        for got, want in zip(as_list(r["times"]), [0.01, 0.1, 1, 10, 100]):
            self.assertAlmostEqual(got, want, delta=1e-12 * want)

    def test_arrays_when_numpy(self):
        r = self.bridge.run({"lattice": {"kind": "chain", "sites": 5}, "start": {"site": 2},
                             "times": [0, 1], "report": ["populations"]})
        pops = r["populations"]
        if ac.HAVE_NUMPY:
            self.assertEqual(tuple(pops.shape), (2, 5))
        else:
            self.assertEqual(len(pops), 2)
            self.assertEqual(len(pops[0]), 5)
        self.assertAlmostEqual(sum(as_list(pops[1])), 1, delta=1e-9)  # unitarity (common practice)

    def test_lab_workflow(self):
        # Design -> plan -> measurement CSV -> reduce and compare, on an
        # invented row of 21 guides 10 um apart, C(d) = 1.2 exp(-0.2 (d - 10))
        # per cm, cut off below the next-nearest distance.
        row = {"kind": "positions", "positions": [[10.0 * i, 0] for i in range(21)],
               "law": {"type": "exponential", "c0": 1.2, "kappa": 0.2, "d0": 10},
               "cutoff": 15}
        plan = self.bridge.run({"id": "plan", "lattice": row, "start": {"site": 10},
                                "plan": {"max_length": 4, "samples": 9, "points": 16},
                                "fabrication": {"jitter": 0.2, "realisations": 4, "seed": 1}})
        self.assertEqual(len(plan["plan"]["samples"]), 9)
        self.assertTrue(plan["plan"]["rationale"])
        lengths = [0.5, 1, 1.5, 2, 2.5, 3]
        walk = self.bridge.run({"lattice": row, "start": {"site": 10}, "times": lengths,
                                "report": ["populations", "msd"], "tolerance": 1e-12})
        rows = ["length,site,intensity"]
        for z, pop in zip(lengths, walk["populations"]):
            rows += ["%r,%d,%r" % (z, j, 1000 * float(p)) for j, p in enumerate(pop)]
        m = self.bridge.run({"lattice": row, "measurement": {"csv": "\n".join(rows) + "\n", "start": 10},
                             "compare": True, "units": {"coupling": "1/cm", "reference": 1.2}})
        self.assertEqual(m["time_unit"], "cm")
        for pt, want in zip(m["points"], as_list(walk["msd"])):
            self.assertAlmostEqual(pt["msd"], want, delta=1e-9 * want)
        for c in m["comparison"]:
            self.assertAlmostEqual(c["overlap"], 1, delta=1e-9)
        # Ballistic spreading, MSD = 2 (C z)^2 d^2 (Childs, Farhi, Gutmann
        # 2002, from memory).
        self.assertAlmostEqual(m["regimes"][0]["exponent"], 2, delta=0.02)
        with self.assertRaises(ac.AmpwalkError) as cm:
            self.bridge.run({"lattice": row, "measurement": {"csv": "length,site,intensity\n1,0,-1\n", "start": 10}})
        self.assertEqual(cm.exception.field, "measurement.csv")
        self.assertTrue(cm.exception.message.startswith("measurement.csv line 2:"))


if __name__ == "__main__":
    unittest.main()
