"""Tests of the ctypes module against a freshly built library ($TRIPOINT_LIB).

Run by cabi's Go tests (go test ./cabi), which build the library first.
Check values: the Go API's results, passed in $TRIPOINT_EXPECT as
"pair a b T rho h" lines (repr floats), so the comparison is bit for bit.
"""

import math
import os
import threading
import unittest

import tripoint


class TestLibrary(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.lib = tripoint.Library()

    def test_names_and_info(self):
        names = self.lib.names()
        self.assertIn("CO2", names)
        self.assertIn("water", names)
        co2 = self.lib.fluid("r744")
        self.assertEqual(co2.name, "CO2")
        self.assertEqual(co2.critical[0], 304.1282)  # Span-Wagner 1996 reducing temperature

    def test_against_go(self):
        path = os.environ.get("TRIPOINT_EXPECT")
        self.assertTrue(path, "TRIPOINT_EXPECT not set")
        with open(path) as f:
            for line in f:
                name, pair, a, b, T, rho, h = line.split()
                st = self.lib.fluid(name).flash(int(pair), float(a), float(b))
                self.assertEqual(st.T, float(T), line)
                self.assertEqual(st.rho, float(rho), line)
                self.assertEqual(st.h, float(h), line)

    def test_errors(self):
        water = self.lib.fluid("water")
        with self.assertRaises(tripoint.InvalidInputError) as cm:
            water.pt(float("nan"), 300.0)
        self.assertIn("p", cm.exception.message)
        with self.assertRaises(tripoint.UndefinedError):
            self.lib.fluid("no such fluid")
        with self.assertRaises(tripoint.InvalidInputError):
            water.prop(tripoint.PT, 1e5, 300.0, 999)
        self.assertTrue(math.isnan(water.prop_n(tripoint.PT, tripoint.PROP_RHO, [float("nan")], [300.0])[0]))

    def test_vector_matches_scalar(self):
        co2 = self.lib.fluid("CO2")
        ps = [1e5, 1e6, 5e6, 1e7]
        ts = [300.0, 280.0, 320.0, 350.0]
        states, stat = co2.flash_n(tripoint.PT, ps, ts)
        self.assertEqual(stat, [tripoint.OK] * 4)
        for st, p, t in zip(states, ps, ts):
            self.assertEqual(st.h, co2.pt(p, t).h)
        hs = co2.prop_n(tripoint.PT, tripoint.PROP_H, ps, ts)
        self.assertEqual(hs, [s.h for s in states])

    def test_derivatives(self):
        water = self.lib.fluid("water")
        # Clausius-Clapeyron along the saturation curve at 373.15 K: dp/dT
        # equals (h'' - h')/(T (v'' - v')) of the saturated phases.
        dpdt = water.curve_derivative(tripoint.CURVE_SATURATION, tripoint.Q_T, 373.15, 0, tripoint.Q_P, tripoint.Q_T)
        liq, vap = water.tq(373.15, 0.0), water.tq(373.15, 1.0)
        cc = (vap.h - liq.h) / (373.15 * (1 / vap.rho - 1 / liq.rho))
        self.assertAlmostEqual(dpdt / cc, 1.0, places=9)
        # (dh/dT)_p of a single phase is its cp.
        st = water.pt(101325.0, 300.0)
        self.assertAlmostEqual(water.derivative(tripoint.PT, 101325.0, 300.0, tripoint.Q_H, tripoint.Q_T, tripoint.Q_P) / st.cp, 1.0, places=9)
        # cp of a two-phase mixture is infinite: an error, not a number.
        with self.assertRaises(tripoint.UndefinedError):
            water.derivative(tripoint.TQ, 373.15, 0.5, tripoint.Q_H, tripoint.Q_T, tripoint.Q_P)

    def test_threads(self):
        co2 = self.lib.fluid("CO2")
        want = co2.prop(tripoint.PT, 2e6, 300.0, tripoint.PROP_H)
        bad = []

        def work():
            for _ in range(2000):
                if co2.prop(tripoint.PT, 2e6, 300.0, tripoint.PROP_H) != want:
                    bad.append(1)

        ts = [threading.Thread(target=work) for _ in range(4)]
        for t in ts:
            t.start()
        for t in ts:
            t.join()
        self.assertEqual(bad, [])


if __name__ == "__main__":
    unittest.main()
