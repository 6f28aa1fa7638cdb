"""Checking a C port of airdata against a golden vector suite.

An engineering and verification aid, not certified flight software.

``airdata port check`` runs every case of a vector suite (``vectors/``, written by
``airdata vectors build``) through a C port that implements
``bindings/c/include/airdata.h``: the bundled port, a user's own C sources, or a
prebuilt library, compiled on the fly with cffi in binary64 and/or binary32.
``airdata port verify`` judges instead a results file that a port running anywhere
wrote from the cases of ``airdata vectors export`` (docs/exchange.md).  Both judge
every output by the suite's own rule (:mod:`airdata.vectors.scale`)::

    |got - expected| <= k * eps * scale

with the case's status compared exactly (binary32: as the case's ``binary32_check``
says), and optionally against the user's accuracy requirements.  Modules:

- :mod:`~airdata.portcheck.suite`: :func:`~airdata.portcheck.suite.load_cases` reads
  and checks a suite (checksums, schema) into arrays;
- :mod:`~airdata.portcheck.build`: :func:`~airdata.portcheck.build.build_port` compiles
  a port and returns a :class:`~airdata.portcheck.build.Port` whose ``run`` gives the
  outputs and statuses of a function's cases;
- :mod:`~airdata.portcheck.results`: reads an ``airdata-results`` file into the same
  arrays, every problem of the file with its line number;
- :mod:`~airdata.portcheck.compare`: :func:`~airdata.portcheck.compare.judge`, the
  reference-equivalent level (the roundoff bound above) of one function;
- :mod:`~airdata.portcheck.requirements`: accuracy requirements in engineering units
  over an envelope (TOML, docs/requirements.md);
- :mod:`~airdata.portcheck.verdict`: :func:`~airdata.portcheck.verdict.judge`, both
  levels per function with engineering-unit errors, margins and bands, as a
  :class:`~airdata.portcheck.verdict.Report`, with the bands and engineering units of
  :mod:`~airdata.portcheck.bands`;
- :mod:`~airdata.portcheck.evidence`: the text summary, JSON report (its schema is
  ``report.schema.json``), JUnit XML and CSV of failures;
- :mod:`~airdata.portcheck.page`: the self-contained HTML page and the plots;
- :mod:`~airdata.portcheck.coverage`: MC/DC, branch, line and region coverage of a
  port by the suite (clang 19, ``airdata port coverage``);
- the ``airdata port`` command line (``check``, ``verify``, ``copy``, ``coverage``) is
  :mod:`airdata.cli.port` with :mod:`airdata.cli.copy` and :mod:`airdata.cli.port_coverage`.
"""

from __future__ import annotations
