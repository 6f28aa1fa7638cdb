"""Checking a C port of airdata against a golden vector suite.

An engineering and verification aid, not certified flight software.

The ``airdata port check`` command runs every case of a vector suite (``vectors/``,
written by ``airdata vectors build``) through a C port that implements
``bindings/c/include/airdata.h``: the bundled port, a user's own C sources, or a
prebuilt library.  The port is compiled on the fly with cffi, together with a small
generated C loop per function (:mod:`airdata.portcheck.build`), in binary64 and/or
binary32, and every output is judged by the suite's own rule (:mod:`airdata.vectors.scale`)::

    |got - expected| <= k * eps * scale

with the case's status compared exactly (binary32: as the case's ``binary32_check``
says).  Python API:

- :func:`airdata.portcheck.suite.load_cases` reads and checks a suite (checksums,
  schema) into arrays;
- :func:`airdata.portcheck.build.build_port` compiles a port and returns a
  :class:`~airdata.portcheck.build.Port`;
- :func:`airdata.portcheck.compare.check_port` runs the cases and returns a
  :class:`~airdata.portcheck.compare.CheckResult` per function and precision;
- :mod:`airdata.portcheck.report` renders the table and the JSON report.
"""

from __future__ import annotations
