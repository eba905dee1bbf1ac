#!/usr/bin/env python3
"""Boil-equivalent minutes of cooling whirlpools with SciPy, for tests/engine/cooling_test.cpp.

Reads a JSON list of courses from argv[1]; each has start_c, minutes and either to_c (straight
course) or per_minute with ambient_c (Newton's law of cooling). Integrates the Malowicki &
Shellhammer (2005) rate ratio r(T) = exp(-11858 (1/T - 1/373.15)), T in kelvin, over the course
with scipy.integrate.quad and prints a JSON list of the integrals, in minutes.
"""
import json
import math
import sys

from scipy.integrate import quad


def temperature(course, t):
    start = course["start_c"]
    if "to_c" in course:
        return start + (course["to_c"] - start) * t / course["minutes"]
    ambient = course["ambient_c"]
    return ambient + (start - ambient) * math.exp(-course["per_minute"] * t)


def ratio(celsius):
    return math.exp(-11858.0 * (1.0 / (celsius + 273.15) - 1.0 / 373.15))


def main():
    courses = json.loads(sys.argv[1])
    results = []
    for course in courses:
        value, _ = quad(lambda t: ratio(temperature(course, t)), 0.0, course["minutes"], epsabs=1e-13,
                        epsrel=1e-13, limit=200)
        results.append(value)
    print(json.dumps(results))


if __name__ == "__main__":
    main()
