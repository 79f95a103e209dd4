"""gusset drives the Gusset structural solver from Python.

Gusset is a solver process that a host starts once and drives with JSON
lines: stiffness analysis, reciprocal force diagrams, Maxwell's load path
and parameter sweeps. This package (standard library only, Python 3.8 and
later) starts the process, sends requests, pairs the answers, streams
progress and sweep steps, and raises typed errors::

    import gusset

    with gusset.Client() as client:
        result = client.solve(model)
        for step in client.sweep(model, {"name": "depth", "from": 1, "to": 4, "count": 31}):
            print(step)

Every result is for preliminary design: a qualified engineer checks the
design against the local codes and standards.
"""

from .binary import BUILD_HINT, find_binary
from .client import Call, Client, Progress, Sweep
from .members import member_check, member_result, member_results, moment_diagram
from .releases import released
from .panels import area_load, inclined_support, local_reactions
from .envelope import governing, member_envelope, on_off_pattern
from .iteration import amplification, slack_members
from .errors import (
    Cancelled,
    ClientClosed,
    ExpressionError,
    GussetError,
    GussetNotFound,
    Infeasible,
    InternalError,
    InvalidModel,
    InvalidParams,
    InvalidRequest,
    LimitExceeded,
    MethodNotFound,
    MissingData,
    NoSolution,
    NotInEquilibrium,
    NotPlanar,
    Overloaded,
    ParseError,
    Problem,
    ProcessDied,
    ProtocolError,
    RequestTimeout,
    ShuttingDown,
    TimeLimit,
    UnknownCase,
    UnstableStructure,
    WrongDimension,
    error_class,
    from_wire,
)

__version__ = "0.1.0"

__all__ = [
    "amplification",
    "slack_members",
    "governing",
    "member_envelope",
    "on_off_pattern",
    "BUILD_HINT",
    "Call",
    "Cancelled",
    "Client",
    "ClientClosed",
    "ExpressionError",
    "GussetError",
    "GussetNotFound",
    "Infeasible",
    "InternalError",
    "InvalidModel",
    "InvalidParams",
    "InvalidRequest",
    "LimitExceeded",
    "MethodNotFound",
    "MissingData",
    "NoSolution",
    "NotInEquilibrium",
    "NotPlanar",
    "Overloaded",
    "ParseError",
    "Problem",
    "ProcessDied",
    "ProtocolError",
    "Progress",
    "RequestTimeout",
    "ShuttingDown",
    "Sweep",
    "TimeLimit",
    "UnknownCase",
    "UnstableStructure",
    "WrongDimension",
    "error_class",
    "find_binary",
    "member_check",
    "member_result",
    "member_results",
    "moment_diagram",
    "released",
    "area_load",
    "inclined_support",
    "local_reactions",
    "from_wire",
]
