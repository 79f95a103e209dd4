"""Typed exceptions of the Gusset client.

Every failure the client reports is a :class:`GussetError`. Errors that the
server sends keep their wire code, kind, problems and detail; each code has
its own subclass so a host can catch exactly what it can handle::

    try:
        result = client.solve(model)
    except gusset.InvalidModel as err:
        for path, message in err.problems:
            highlight(path, message)

Errors raised by the client itself (the binary missing, the process dying,
a garbled output line, a timeout) have ``code`` None.
"""

from typing import Any, Dict, List, NamedTuple, Optional, Sequence, Tuple, Type

__all__ = [
    "Problem",
    "GussetError",
    "GussetNotFound",
    "ProcessDied",
    "ProtocolError",
    "RequestTimeout",
    "ClientClosed",
    # BEGIN GENERATED: error names
    "ParseError",
    "InvalidRequest",
    "MethodNotFound",
    "InvalidParams",
    "InternalError",
    "Cancelled",
    "LimitExceeded",
    "Overloaded",
    "ShuttingDown",
    "TimeLimit",
    "InvalidModel",
    "ExpressionError",
    "UnstableStructure",
    "NotPlanar",
    "NotInEquilibrium",
    "WrongDimension",
    "MissingData",
    "Infeasible",
    "NoSolution",
    "UnknownCase",
    # END GENERATED: error names
    "error_class",
    "from_wire",
]


class Problem(NamedTuple):
    """Problem locates one defect in a request.

    ``path`` is a JSON pointer (RFC 6901) from the root of the request
    object, for example ``/params/model/members/0/ends/1``; "" means the
    whole request. ``message`` says what is wrong there.
    """

    path: str
    message: str


class GussetError(Exception):
    """GussetError is the base of every error the client raises.

    Attributes:
        code: the wire error code, or None for errors raised by the client.
        message: a sentence a person can act on.
        kind: the short name of the error class ("invalid params", ...).
        problems: the located defects, as (path, message) pairs.
        detail: structured data for some errors (a mechanism's motions, a
            limit and the value that exceeded it), else None.
        request_id: the id of the request that failed, when known.
        method: the method of the request that failed, when known.
    """

    #: CODE is the wire code a subclass stands for (None for client errors).
    CODE: Optional[int] = None
    #: KIND is the default kind name of a subclass.
    KIND: str = ""

    def __init__(
        self,
        message: str,
        code: Optional[int] = None,
        kind: Optional[str] = None,
        problems: Sequence[Problem] = (),
        detail: Any = None,
        request_id: Any = None,
        method: Optional[str] = None,
    ) -> None:
        super().__init__(message)
        self.message = message
        self.code = self.CODE if code is None else code
        self.kind = self.KIND if kind is None else kind
        self.problems: List[Problem] = [Problem(p[0], p[1]) for p in problems]
        self.detail = detail
        self.request_id = request_id
        self.method = method

    def __str__(self) -> str:
        text = self.message
        if self.code is not None:
            text += " (code %d)" % self.code
        for problem in self.problems:
            text += "\n  at %s: %s" % (problem.path or "(the request)", problem.message)
        return text


class GussetNotFound(GussetError):
    """GussetNotFound means no gusset binary could be found or started.

    ``searched`` lists the places looked at, in order.
    """

    KIND = "binary not found"

    def __init__(self, message: str, searched: Sequence[str] = ()) -> None:
        super().__init__(message)
        self.searched = list(searched)


class ProcessDied(GussetError):
    """ProcessDied means the gusset process ended while a request was in flight.

    ``returncode`` is the exit status (negative: the signal that killed it,
    on POSIX) and ``stderr`` the last lines the process wrote to its
    standard error. The next call starts a new process.
    """

    KIND = "process died"

    def __init__(
        self,
        message: str,
        returncode: Optional[int] = None,
        stderr: str = "",
        request_id: Any = None,
        method: Optional[str] = None,
    ) -> None:
        super().__init__(message, request_id=request_id, method=method)
        self.returncode = returncode
        self.stderr = stderr


class ProtocolError(GussetError):
    """ProtocolError means the process wrote a line that is not a protocol message.

    Such a line may have been a response, so every request in flight when
    it arrived fails with this error; ``line`` holds the offending text.
    The process itself goes on.
    """

    KIND = "protocol error"

    def __init__(
        self, message: str, line: str = "", request_id: Any = None, method: Optional[str] = None
    ) -> None:
        super().__init__(message, request_id=request_id, method=method)
        self.line = line


class RequestTimeout(GussetError, TimeoutError):
    """RequestTimeout means no answer came within the request's timeout.

    The client has sent a cancel for the request, so the server stops
    working on it. It is also a built-in :class:`TimeoutError`.
    """

    KIND = "timeout"


class ClientClosed(GussetError):
    """ClientClosed means the client was closed before or during the call."""

    KIND = "closed"


# BEGIN GENERATED: error classes (by go generate ./protocol from the error-code table; do not edit)


class ParseError(GussetError):
    """ParseError (-32700): the line is not JSON, or is longer than ``--max-line-bytes`` (id null; reading goes on)."""

    CODE = -32700
    KIND = "parse error"


class InvalidRequest(GussetError):
    """InvalidRequest (-32600): not a JSON-RPC 2.0 request object; an id already in flight."""

    CODE = -32600
    KIND = "invalid request"


class MethodNotFound(GussetError):
    """MethodNotFound (-32601): unknown method."""

    CODE = -32601
    KIND = "method not found"


class InvalidParams(GussetError):
    """InvalidParams (-32602): params do not follow the schema (wrong types, unknown fields, numbers out of double range)."""

    CODE = -32602
    KIND = "invalid params"


class InternalError(GussetError):
    """InternalError (-32603): a bug (a recovered panic); the process goes on."""

    CODE = -32603
    KIND = "internal error"


class Cancelled(GussetError):
    """Cancelled (-32000): stopped by ``cancel``."""

    CODE = -32000
    KIND = "cancelled"


class LimitExceeded(GussetError):
    """LimitExceeded (-32001): a model or sweep over the limits."""

    CODE = -32001
    KIND = "limit exceeded"


class Overloaded(GussetError):
    """Overloaded (-32002): reserved for too many waiting requests."""

    CODE = -32002
    KIND = "overloaded"


class ShuttingDown(GussetError):
    """ShuttingDown (-32003): the server is stopping."""

    CODE = -32003
    KIND = "shutting down"


class TimeLimit(GussetError):
    """TimeLimit (-32004): the request ran longer than ``--time-limit``."""

    CODE = -32004
    KIND = "time limit"


class InvalidModel(GussetError):
    """InvalidModel (1000): duplicate or dangling ids, zero-length members, coincident nodes, dimension mismatches, non-positive stiffness or area, an empty model, ...."""

    CODE = 1000
    KIND = "invalid model"


class ExpressionError(GussetError):
    """ExpressionError (1001): unknown parameter, syntax error, division by zero, non-finite value."""

    CODE = 1001
    KIND = "expression error"


class UnstableStructure(GussetError):
    """UnstableStructure (1002): a mechanism; ``data.detail`` carries its freedoms and node motions."""

    CODE = 1002
    KIND = "unstable structure"


class NotPlanar(GussetError):
    """NotPlanar (1003): members cross without a shared node."""

    CODE = 1003
    KIND = "not planar"


class NotInEquilibrium(GussetError):
    """NotInEquilibrium (1004): forces that do not balance, with the closure error."""

    CODE = 1004
    KIND = "not in equilibrium"


class WrongDimension(GussetError):
    """WrongDimension (1005): a 2D-only method given a 3D model."""

    CODE = 1005
    KIND = "wrong dimension"


class MissingData(GussetError):
    """MissingData (1006): e.g. material limits needed for sizing."""

    CODE = 1006
    KIND = "missing data"


class Infeasible(GussetError):
    """Infeasible (1007): loads that cannot reach a support."""

    CODE = 1007
    KIND = "infeasible"


class NoSolution(GussetError):
    """NoSolution (1008): an edited force diagram no form fits."""

    CODE = 1008
    KIND = "no solution"


class UnknownCase(GussetError):
    """UnknownCase (1009): a case or combination id that does not exist."""

    CODE = 1009
    KIND = "unknown case"


#: WIRE_ERRORS lists the classes of the wire codes, in code-table order.
WIRE_ERRORS: Tuple[Type[GussetError], ...] = (
    ParseError,
    InvalidRequest,
    MethodNotFound,
    InvalidParams,
    InternalError,
    Cancelled,
    LimitExceeded,
    Overloaded,
    ShuttingDown,
    TimeLimit,
    InvalidModel,
    ExpressionError,
    UnstableStructure,
    NotPlanar,
    NotInEquilibrium,
    WrongDimension,
    MissingData,
    Infeasible,
    NoSolution,
    UnknownCase,
)
# END GENERATED: error classes

_BY_CODE: Dict[int, Type[GussetError]] = {cls.CODE: cls for cls in WIRE_ERRORS if cls.CODE is not None}


def error_class(code: int) -> Type[GussetError]:
    """error_class returns the exception class for a wire code, GussetError for unknown codes."""
    return _BY_CODE.get(code, GussetError)


def from_wire(error: Any, request_id: Any = None, method: Optional[str] = None) -> GussetError:
    """from_wire builds the typed exception for a JSON-RPC error object.

    Malformed error objects (missing fields, wrong types) still give a
    GussetError rather than failing, since they come from another process.
    """
    if not isinstance(error, dict):
        return ProtocolError("The server sent an error that is not an object: %r." % (error,),
                             request_id=request_id, method=method)
    code = error.get("code")
    if not isinstance(code, int) or isinstance(code, bool):
        code = None
    message = error.get("message")
    if not isinstance(message, str) or not message:
        message = "The server reported an error without a message."
    data = error.get("data")
    kind = None
    problems: List[Problem] = []
    detail = None
    if isinstance(data, dict):
        if isinstance(data.get("kind"), str):
            kind = data["kind"]
        for item in data.get("problems") or ():
            if isinstance(item, dict):
                problems.append(Problem(str(item.get("path", "")), str(item.get("message", ""))))
        detail = data.get("detail")
    cls = error_class(code) if code is not None else GussetError
    return cls(message, code=code, kind=kind, problems=problems, detail=detail,
               request_id=request_id, method=method)
