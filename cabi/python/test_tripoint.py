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


class TestTables(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.lib = tripoint.Library()
        cls.co2 = cls.lib.fluid("CO2")
        cls.tab = cls.co2.table()

    @classmethod
    def tearDownClass(cls):
        cls.tab.close()

    def test_against_the_equation(self):
        # States of our own in the liquid, vapour, supercritical and
        # two-phase regions: the tables within 1e-6 of the equation.
        for p, T in [(6e6, 280.0), (1e6, 300.0), (10e6, 330.0), (20e6, 600.0)]:
            ref = self.co2.pt(p, T)
            for st in (self.tab.pt(p, T), self.tab.ph(p, ref.h), self.tab.du(ref.rho, ref.u)):
                self.assertTrue(self.tab.covers(tripoint.PT, p, T))
                self.assertEqual(st.phase, ref.phase)
                self.assertLess(abs(st.T / ref.T - 1), 1e-6)
                self.assertLess(abs(st.rho / ref.rho - 1), 1e-6)
        mix = self.co2.pq(3e6, 0.4)
        st = self.tab.ph(3e6, mix.h)
        self.assertEqual(st.phase, tripoint.TWO_PHASE)
        self.assertLess(abs(st.quality - 0.4), 1e-6)

    def test_info_and_neighbourhood(self):
        p1, p2, t1, t2, rho1, rho2 = self.tab.neighbourhood
        self.assertLess(p1, self.co2.critical[1])
        self.assertGreater(self.tab.bytes, 0)
        # At the critical point itself the equation answers.
        self.assertFalse(self.tab.covers(tripoint.PT, self.co2.critical[1] * 1.01, self.co2.critical[0] * 1.001))
        st = self.tab.pt(self.co2.critical[1] * 1.01, self.co2.critical[0] * 1.001)
        self.assertEqual(st.phase, tripoint.SUPERCRITICAL)

    def test_vector_and_prop(self):
        ps, ts = [1e6, float("nan"), 2e6], [300.0, 300.0, 320.0]
        states, stat = self.tab.flash_n(tripoint.PT, ps, ts)
        self.assertEqual(stat, [tripoint.OK, tripoint.INVALID_INPUT, tripoint.OK])
        self.assertEqual(states[0].h, self.tab.prop(tripoint.PT, 1e6, 300.0, tripoint.PROP_H))

    def test_errors(self):
        with self.assertRaises(tripoint.InvalidInputError):
            self.tab.flash(tripoint.PS, 1e5, 100.0)
        with self.assertRaises(tripoint.OutOfRangeError):
            self.co2.table(p_max=1e6)  # does not enclose the critical neighbourhood
        t = self.co2.table(p_max=20e6)
        t.close()
        t.close()  # a second close does nothing
        with self.assertRaises(tripoint.InvalidInputError):
            t.pt(1e6, 300.0)


if __name__ == "__main__":
    unittest.main()
