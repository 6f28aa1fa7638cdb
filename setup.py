"""Build hook for the C port's cffi modules (metadata lives in pyproject.toml).

setuptools needs a setup.py to take ``cffi_modules``; see airdata/_cport_build.py.
"""

from setuptools import setup

setup(
    cffi_modules=[
        "airdata/_cport_build.py:ffibuilder64",
        "airdata/_cport_build.py:ffibuilder32",
    ],
)
