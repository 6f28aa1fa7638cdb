"""JSON Schema (draft 2020-12) of the suite files, and a small validator.

The schemas are generated from the catalogue: one for the manifest and one per
function file (so that each function's inputs, outputs and scales are named exactly,
with ``additionalProperties: false`` everywhere).  Their file names carry the schema
version.  The runtime has no ``jsonschema`` dependency: :func:`validate` implements the
subset of keywords these schemas use and refuses any other keyword, so it can never
silently skip a rule.  The test suite checks it agrees with the ``jsonschema`` package.
"""

from __future__ import annotations

import re
from collections.abc import Iterator
from typing import Any

from ..status import Status
from .cases import LATER_TAGS, TAGS
from .catalogue import FunctionSpec

__all__ = ["SCHEMA_VERSION", "DIALECT", "manifest_schema", "function_schema",
           "schema_path_of_manifest", "schema_path_of_function", "validate", "SchemaError"]

#: Version of the file formats; part of every schema file name.
SCHEMA_VERSION = 1
DIALECT = "https://json-schema.org/draft/2020-12/schema"

DEC_PATTERN = r"^(nan|-?inf|-?[0-9]+(\.[0-9]+)?(e[+-][0-9]+)?)$"
HEX_PATTERN = r"^(nan|-?inf|-?0x[01](\.[0-9a-f]*[1-9a-f])?p[+-][0-9]+)$"
SHA256_PATTERN = r"^[0-9a-f]{64}$"
SEMVER_PATTERN = r"^(0|[1-9][0-9]*)\.(0|[1-9][0-9]*)\.(0|[1-9][0-9]*)$"
CASE_ID_PATTERN = r"^[0-9a-f]{12}$"
NAME_PATTERN = r"^[a-z][a-z0-9_]*$"

_NUMBER = {
    "description": "a binary64 value as [shortest round-trip decimal, exact C99 hex float]; "
                   "NaN and infinities are \"nan\", \"inf\", \"-inf\" in both forms",
    "type": "array",
    "prefixItems": [{"type": "string", "pattern": DEC_PATTERN},
                    {"type": "string", "pattern": HEX_PATTERN}],
    "items": False,
    "minItems": 2,
    "maxItems": 2,
}
_STATUS_NAMES = {s.name: int(s) for s in Status}


def schema_path_of_manifest() -> str:
    """Suite-relative path of the manifest schema."""
    return f"schema/manifest-v{SCHEMA_VERSION}.schema.json"


def schema_path_of_function(name: str) -> str:
    """Suite-relative path of the schema of function file ``name``."""
    return f"schema/function-{name}-v{SCHEMA_VERSION}.schema.json"


def _closed(props: dict[str, Any], required: list[str] | None = None, **extra: Any
            ) -> dict[str, Any]:
    return {"type": "object", "properties": props,
            "required": list(props) if required is None else required,
            "additionalProperties": False, **extra}


def _tolerance_schema() -> dict[str, Any]:
    return _closed({
        "k": {"type": "integer", "minimum": 1},
        "eps_binary64": {"$ref": "#/$defs/number"},
        "eps_binary32": {"$ref": "#/$defs/number"},
        "rule": {"type": "string"},
        "binary32_status_rule": {"type": "string"},
    })


def _statuses_schema() -> dict[str, Any]:
    return _closed({k: {"const": v} for k, v in _STATUS_NAMES.items()})


def function_schema(spec: FunctionSpec) -> dict[str, Any]:
    """The schema of the vector file of one catalogue function."""
    real = [a.name for a in spec.args if a.kind == "real"]
    flags = [a.name for a in spec.args if a.kind == "flag"]
    inputs = {n: {"$ref": "#/$defs/number"} for n in real}
    inputs.update({n: {"type": "integer", "enum": [0, 1]} for n in flags})
    inputs = {a.name: inputs[a.name] for a in spec.args}
    outs = {o: {"$ref": "#/$defs/number"} for o, _ in spec.outputs}
    arg_item = _closed({
        "name": {"enum": [a.name for a in spec.args]},
        "unit": {"type": "string"},
        "kind": {"enum": ["real", "flag"]},
        "valid": {"type": "string"},
    })
    out_item = _closed({"name": {"enum": [o for o, _ in spec.outputs]},
                        "unit": {"type": "string"}})
    case = _closed({
        "id": {"type": "string", "pattern": CASE_ID_PATTERN},
        "tags": {"type": "array", "items": {"enum": sorted(TAGS)}, "uniqueItems": True},
        "inputs": _closed(inputs),
        "expected": _closed(outs),
        "scale": _closed(outs),
        "status": {"enum": sorted(_STATUS_NAMES.values())},
        "binary32_check": {"enum": ["full", "lenient", "skip"]},
    })
    return {
        "$schema": DIALECT,
        "$id": f"airdata-vectors:{schema_path_of_function(spec.name)}",
        "title": f"airdata golden vectors: {spec.name} (format version {SCHEMA_VERSION})",
        "$defs": {"number": _NUMBER},
        **_closed({
            "schema": {"const": schema_path_of_function(spec.name)},
            "function": {"const": spec.name},
            "c_function": {"const": spec.c_name},
            "summary": {"type": "string"},
            "equations": {"type": "array", "items": {"type": "string",
                                                     "pattern": r"^[A-Z]{3}-[0-9]+$"},
                          "minItems": 1},
            "profile": {"type": "string", "pattern": NAME_PATTERN},
            "suite_version": {"type": "string", "pattern": SEMVER_PATTERN},
            "inputs": {"type": "array", "items": arg_item, "minItems": len(spec.args),
                       "maxItems": len(spec.args)},
            "outputs": {"type": "array", "items": out_item, "minItems": len(spec.outputs),
                        "maxItems": len(spec.outputs)},
            "statuses": _statuses_schema(),
            "tolerance": _tolerance_schema(),
            "tags": _closed({k: {"const": v} for k, v in sorted(TAGS.items())},
                            [k for k in sorted(TAGS) if k not in LATER_TAGS]),
            "counts": _closed({"valid": {"type": "integer", "minimum": 0},
                               "invalid": {"type": "integer", "minimum": 0}}),
            "cases": {"type": "array", "items": case, "minItems": 1},
        }),
    }


def manifest_schema() -> dict[str, Any]:
    """The schema of the suite manifest."""
    file_entry = _closed({
        # Relative, no component starting with a dot (so no "..").
        "path": {"type": "string",
                 "pattern": r"^([A-Za-z0-9_-][A-Za-z0-9_.-]*/)*[A-Za-z0-9_-][A-Za-z0-9_.-]*$"},
        "sha256": {"type": "string", "pattern": SHA256_PATTERN},
        "bytes": {"type": "integer", "minimum": 0},
    })
    function_entry = _closed({
        "function": {"type": "string", "pattern": NAME_PATTERN},
        "path": {"type": "string", "pattern": r"^functions/[a-z0-9_]+\.json$"},
        "c_header": {"type": "string", "pattern": r"^c/[a-z0-9_]+\.h$"},
        "sha256": {"type": "string", "pattern": SHA256_PATTERN},
        "bytes": {"type": "integer", "minimum": 0},
        "valid": {"type": "integer", "minimum": 0},
        "invalid": {"type": "integer", "minimum": 0},
    })
    real = {"type": "number"}
    reals = {"type": "array", "items": real}
    profile = _closed({
        "name": {"type": "string"}, "source": {"type": "string"},
        "definitions": _closed({k: {"type": "string"} for k in
                                ("g0", "R", "R_star", "M0", "T0", "p0", "r0", "beta", "S")},
                               required=["g0", "T0", "p0", "r0", "beta", "S"]),
        **{k: real for k in ("g0", "R", "T0", "p0", "rho0", "a0", "r0", "h_min", "h_max",
                             "p_min", "p_max", "sutherland_beta", "sutherland_s", "gamma")},
        **{k: reals for k in ("layer_base", "lapse_rate", "base_temperature",
                              "base_pressure")},
    })
    return {
        "$schema": DIALECT,
        "$id": f"airdata-vectors:{schema_path_of_manifest()}",
        "title": f"airdata golden vectors: suite manifest (format version {SCHEMA_VERSION})",
        "$defs": {"number": _NUMBER},
        **_closed({
            "schema": {"const": schema_path_of_manifest()},
            "suite": {"const": "airdata golden vectors"},
            "suite_version": {"type": "string", "pattern": SEMVER_PATTERN},
            "schema_version": {"const": SCHEMA_VERSION},
            "generator": _closed({"package": {"const": "airdata"},
                                  "version": {"type": "string"}}),
            "caution": {"type": "string"},
            "profile": profile,
            "statuses": _statuses_schema(),
            "tolerance": _tolerance_schema(),
            "functions": {"type": "array", "items": function_entry, "minItems": 1},
            "files": {"type": "array", "items": file_entry},
            "totals": _closed({"functions": {"type": "integer", "minimum": 0},
                               "cases": {"type": "integer", "minimum": 0},
                               "valid": {"type": "integer", "minimum": 0},
                               "invalid": {"type": "integer", "minimum": 0}}),
        }),
    }


# ---------------------------------------------------------------------------------
# Validator
# ---------------------------------------------------------------------------------

class SchemaError(ValueError):
    """A schema uses a keyword this validator does not implement."""


_ANNOTATIONS = {"$schema", "$id", "$defs", "title", "description"}
_KEYWORDS = _ANNOTATIONS | {
    "$ref", "type", "enum", "const", "properties", "required", "additionalProperties",
    "items", "prefixItems", "minItems", "maxItems", "uniqueItems", "pattern", "minimum",
    "maximum",
}


def _type_ok(value: Any, t: str) -> bool:
    if t == "object":
        return isinstance(value, dict)
    if t == "array":
        return isinstance(value, list)
    if t == "string":
        return isinstance(value, str)
    if t == "boolean":
        return isinstance(value, bool)
    if t == "null":
        return value is None
    if isinstance(value, bool):
        return False
    if t == "integer":
        return isinstance(value, int) or (isinstance(value, float) and value.is_integer())
    if t == "number":
        return isinstance(value, (int, float))
    raise SchemaError(f"unknown type {t!r}")


def _equal(a: Any, b: Any) -> bool:
    """JSON equality (1 == 1.0, but True != 1)."""
    if isinstance(a, bool) or isinstance(b, bool):
        return isinstance(a, bool) and isinstance(b, bool) and a == b
    if isinstance(a, (int, float)) and isinstance(b, (int, float)):
        return a == b
    if isinstance(a, list) and isinstance(b, list):
        return len(a) == len(b) and all(_equal(x, y) for x, y in zip(a, b, strict=True))
    if isinstance(a, dict) and isinstance(b, dict):
        return a.keys() == b.keys() and all(_equal(a[k], b[k]) for k in a)
    return type(a) is type(b) and a == b


def _resolve(root: dict[str, Any], ref: str) -> Any:
    if not ref.startswith("#/"):
        raise SchemaError(f"only local $ref is supported, got {ref!r}")
    node: Any = root
    for part in ref[2:].split("/"):
        node = node[part.replace("~1", "/").replace("~0", "~")]
    return node


def _iter_errors(value: Any, schema: Any, root: dict[str, Any], path: str
                 ) -> Iterator[str]:
    if schema is True:
        return
    if schema is False:
        yield f"{path or '/'}: no value is allowed here"
        return
    unknown = set(schema) - _KEYWORDS
    if unknown:
        raise SchemaError(f"unsupported schema keyword(s) {sorted(unknown)}")
    where = path or "/"
    if "$ref" in schema:
        yield from _iter_errors(value, _resolve(root, schema["$ref"]), root, path)
    if "type" in schema and not _type_ok(value, schema["type"]):
        yield f"{where}: expected {schema['type']}, got {type(value).__name__}"
        return
    if "const" in schema and not _equal(value, schema["const"]):
        yield f"{where}: must be {schema['const']!r}, got {value!r}"
    if "enum" in schema and not any(_equal(value, e) for e in schema["enum"]):
        yield f"{where}: {value!r} is not one of {schema['enum']!r}"
    if isinstance(value, str) and "pattern" in schema:
        if re.search(schema["pattern"], value) is None:
            yield f"{where}: {value!r} does not match {schema['pattern']!r}"
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        if "minimum" in schema and value < schema["minimum"]:
            yield f"{where}: {value!r} is less than the minimum {schema['minimum']!r}"
        if "maximum" in schema and value > schema["maximum"]:
            yield f"{where}: {value!r} is more than the maximum {schema['maximum']!r}"
    if isinstance(value, dict):
        props = schema.get("properties", {})
        for key in schema.get("required", []):
            if key not in value:
                yield f"{where}: missing required property {key!r}"
        for key, v in value.items():
            if key in props:
                yield from _iter_errors(v, props[key], root, f"{path}/{key}")
            elif "additionalProperties" in schema:
                extra = schema["additionalProperties"]
                if extra is False:
                    yield f"{where}: unexpected property {key!r}"
                else:
                    yield from _iter_errors(v, extra, root, f"{path}/{key}")
    if isinstance(value, list):
        if "minItems" in schema and len(value) < schema["minItems"]:
            yield f"{where}: {len(value)} items, fewer than {schema['minItems']}"
        if "maxItems" in schema and len(value) > schema["maxItems"]:
            yield f"{where}: {len(value)} items, more than {schema['maxItems']}"
        prefix = schema.get("prefixItems", [])
        for i, v in enumerate(value):
            if i < len(prefix):
                yield from _iter_errors(v, prefix[i], root, f"{path}/{i}")
            elif "items" in schema:
                yield from _iter_errors(v, schema["items"], root, f"{path}/{i}")
        if schema.get("uniqueItems"):
            for i in range(len(value)):
                if any(_equal(value[i], value[j]) for j in range(i)):
                    yield f"{where}: item {i} repeats an earlier item"
                    break


def validate(instance: Any, schema: dict[str, Any], limit: int = 20) -> list[str]:
    """Errors of ``instance`` against ``schema`` (at most ``limit``; empty if valid).

    Each error starts with the JSON pointer of the offending value.

    Raises
    ------
    SchemaError
        If the schema uses a keyword outside the supported subset.
    """
    errors: list[str] = []
    for err in _iter_errors(instance, schema, schema, ""):
        errors.append(err)
        if len(errors) >= limit:
            break
    return errors
