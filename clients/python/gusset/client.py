"""Client drives one ``gusset serve`` process over its standard input and output."""

import itertools
import json
import logging
import os
import queue
import signal
import subprocess
import threading
import time
from collections import deque
from typing import (
    Any,
    Callable,
    Deque,
    Dict,
    Iterator,
    List,
    Mapping,
    NamedTuple,
    Optional,
    Sequence,
    Set,
    Union,
)

from .binary import find_binary
from .errors import (
    ClientClosed,
    GussetError,
    GussetNotFound,
    LimitExceeded,
    ProcessDied,
    ProtocolError,
    RequestTimeout,
    from_wire,
)

__all__ = ["Client", "Call", "Sweep", "Progress"]

log = logging.getLogger("gusset")

#: Lines above this size are checked against the server's line limit
#: before sending: the server answers an oversize line with an error whose id
#: is null, which could never be paired with its request.
_CHECK_LINE_BYTES = 1 << 20


class Progress(NamedTuple):
    """Progress is one progress notification of a request.

    ``stage`` names the phase ("ordering", "factorising", "step", ...);
    ``done`` counts finished units of the stage out of ``total`` (0 when
    unknown); ``partial`` is an intermediate result (for a sweep, the step
    just computed) or None.
    """

    request: Any
    stage: str
    done: int
    total: int
    partial: Any


_FINAL = object()  # ends a call's progress queue


class Call:
    """Call is one request in flight, returned by :meth:`Client.start`.

    Iterating over a Call yields its :class:`Progress` notifications as they
    arrive and ends when the final response has come (raising the call's
    error, if it failed); :meth:`result` waits for the final result. The
    request's timeout counts from when it was sent and is enforced while a
    thread waits on the call: on expiry the request is cancelled and
    :class:`RequestTimeout` raised.
    """

    def __init__(
        self,
        client: "Client",
        request_id: int,
        method: str,
        timeout: Optional[float],
        keep_progress: bool,
        on_progress: Optional[Callable[[Progress], None]],
    ) -> None:
        self._client = client
        self._id = request_id
        self._method = method
        self._timeout = timeout
        self._deadline = None if timeout is None else time.monotonic() + timeout
        self._queue: "Optional[queue.SimpleQueue[Any]]" = queue.SimpleQueue() if keep_progress else None
        self._on_progress = on_progress
        self._finished = threading.Event()
        self._drained = False
        self._result: Any = None
        self._error: Optional[GussetError] = None
        self._process: "Optional[_Process]" = None

    @property
    def id(self) -> int:
        """id is the request's JSON-RPC id."""
        return self._id

    @property
    def method(self) -> str:
        """method is the request's method name."""
        return self._method

    def done(self) -> bool:
        """done reports whether the final response (or a failure) has arrived."""
        return self._finished.is_set()

    def result(self, timeout: Optional[float] = None) -> Any:
        """result waits for the final response and returns its result.

        ``timeout`` (seconds) bounds this wait further than the request's
        own timeout; on expiry the request is cancelled.

        Raises:
            GussetError: the server's error for this request (a subclass per
                code), or RequestTimeout, ProcessDied, ProtocolError,
                ClientClosed.
        """
        wait, seconds = self._remaining(), self._timeout
        if timeout is not None and (wait is None or timeout < wait):
            wait, seconds = timeout, timeout
        if not self._finished.wait(wait):
            self._client._give_up(self, seconds)
            self._finished.wait()
        if self._error is not None:
            raise self._error
        return self._result

    def progress(self) -> Iterator[Progress]:
        """progress yields the call's progress notifications as they arrive.

        It ends after the last notification once the final response has
        come, and raises the call's error if it failed. Only one thread
        should iterate over a call.
        """
        if self._queue is None:
            raise RuntimeError("gusset: this call keeps no progress; start it with keep_progress=True")
        while not self._drained:
            wait = self._remaining()
            try:
                item = self._queue.get() if wait is None else self._queue.get(timeout=max(wait, 0.0))
            except queue.Empty:
                self._client._give_up(self, self._timeout)
                continue
            if item is _FINAL:
                self._drained = True
                break
            yield item
        if self._error is not None:
            raise self._error

    def __iter__(self) -> Iterator[Any]:
        return self.progress()

    def cancel(self) -> bool:
        """cancel asks the server to stop this request.

        It returns True when the request was still in flight; the call then
        ends with :class:`Cancelled`. See :meth:`Client.cancel`.
        """
        return self._client.cancel(self)

    def __repr__(self) -> str:
        state = "done" if self.done() else "in flight"
        return "<gusset.%s %s id=%d %s>" % (type(self).__name__, self._method, self._id, state)

    def _remaining(self) -> Optional[float]:
        if self._deadline is None:
            return None
        return max(self._deadline - time.monotonic(), 0.0)

    def _progress(self, item: Progress) -> None:
        if self._on_progress is not None:
            try:
                self._on_progress(item)
            except Exception:  # a host's callback must not stop the reader
                log.exception("gusset: the on_progress callback of request %d raised", self._id)
        if self._queue is not None:
            self._queue.put(item)

    def _finish(self, result: Any, error: Optional[GussetError]) -> None:
        self._result = result
        self._error = error
        # The event is set before the end marker is queued, so a thread that
        # has read every progress item already sees the call as done.
        self._finished.set()
        if self._queue is not None:
            self._queue.put(_FINAL)


class Sweep(Call):
    """Sweep is a sweep-parameter request in flight.

    Iterating over it yields each step (the ``partial`` of the progress
    notifications of stage "step") as soon as the server has computed it;
    other progress is skipped (see :meth:`progress` for all of it).
    :meth:`result` returns the final result with every step in index order
    and the optimum, if one was asked for.
    """

    def steps(self) -> Iterator[Any]:
        """steps yields the sweep's steps as they stream; see the class doc."""
        for item in self.progress():
            if item.stage == "step" and item.partial is not None:
                yield item.partial

    def __iter__(self) -> Iterator[Any]:
        return self.steps()


class _Process:
    """_Process is one running server with the requests sent to it."""

    def __init__(self, popen: "subprocess.Popen[bytes]", stderr_lines: int) -> None:
        self.popen = popen
        self.lock = threading.Lock()  # guards pending, abandoned, dead
        self.write_lock = threading.Lock()
        self.pending: Dict[int, Call] = {}
        self.abandoned: Set[int] = set()  # given up on; their answers are dropped quietly
        self.sending: Set[int] = set()  # registered, line still being written
        self.dead = False
        self.stderr_tail: Deque[str] = deque(maxlen=stderr_lines)
        self.max_line_bytes: Optional[int] = None
        self.stdout_thread: Optional[threading.Thread] = None
        self.stderr_thread: Optional[threading.Thread] = None


Model = Mapping[str, Any]


class Client:
    """Client starts one gusset process and sends it requests.

    ::

        with gusset.Client() as client:
            print(client.describe()["version"])
            result = client.solve(model)
            for step in client.sweep(model, {"name": "depth", "from": 1, "to": 4, "count": 31}):
                print(step)

    The binary is ``binary`` when given, else the GUSSET_BINARY environment
    variable, else ``gusset`` on PATH, else the root of the repository the
    client sits in (see :func:`gusset.find_binary`). The process starts at
    once and is kept; if it dies, the requests in flight fail with
    :class:`ProcessDied` and the next call starts a new one.

    Every method also takes its whole params dict positionally, as it is
    written on the wire: ``client.solve({"model": m, "cases": ["dead"]})``
    is ``client.solve(m, cases=["dead"])``, and
    ``client.optimise_layout({"supports": ..., "cases": ...})`` is the
    call with those keywords; keywords given beside the dict add to it.

    A Client is safe to use from several threads at once: requests get
    increasing integer ids and the answers are paired by id, whatever order
    the server sends them in.

    Args:
        binary: path (or name on PATH) of the gusset binary.
        jobs: requests the server works on at once (``--jobs``); default
            the number of CPUs.
        time_limit: the server's wall-time limit per request in seconds
            (``--time-limit``); exceeding it raises :class:`TimeLimit`.
        args: further command-line flags of ``gusset serve``.
        timeout: the default timeout of each request in seconds (None
            waits for ever); see :meth:`start`.
        env: the process's environment (default this process's).
        cwd: the process's working directory.
        stderr_lines: how many of the process's last standard-error lines
            to keep for :class:`ProcessDied` messages.

    Raises:
        GussetNotFound: no binary was found, or it could not be started.
    """

    def __init__(
        self,
        binary: Optional[str] = None,
        *,
        jobs: Optional[int] = None,
        time_limit: Optional[float] = None,
        args: Sequence[str] = (),
        timeout: Optional[float] = None,
        env: Optional[Mapping[str, str]] = None,
        cwd: Optional[str] = None,
        stderr_lines: int = 50,
    ) -> None:
        self.binary = find_binary(binary)
        argv = [self.binary, "serve"]
        if jobs is not None:
            argv += ["--jobs", str(int(jobs))]
        if time_limit is not None:
            argv += ["--time-limit", repr(float(time_limit))]
        argv += [str(a) for a in args]
        self._argv = argv
        self.timeout = timeout
        self._env = None if env is None else dict(env)
        self._cwd = cwd
        self._stderr_lines = stderr_lines
        self._ids = itertools.count(1)
        self._lock = threading.Lock()  # guards _proc, _closed and the id counter
        self._closed = False
        self._proc: Optional[_Process] = None
        with self._lock:
            self._proc = self._spawn()

    # Process management.

    @property
    def pid(self) -> Optional[int]:
        """pid is the process id of the running server, None when there is none."""
        proc = self._proc
        if proc is None or proc.dead or proc.popen.poll() is not None:
            return None
        return proc.popen.pid

    def _spawn(self) -> _Process:
        try:
            popen = subprocess.Popen(
                self._argv,
                stdin=subprocess.PIPE,
                stdout=subprocess.PIPE,
                stderr=subprocess.PIPE,
                env=self._env,
                cwd=self._cwd,
            )
        except OSError as err:
            raise GussetNotFound(
                "The gusset binary %r could not be started: %s.\n"
                "Build it from the root of the Gusset repository with:\n"
                "    go build -o gusset ./cmd/gusset" % (self.binary, err),
                [self.binary],
            ) from err
        proc = _Process(popen, self._stderr_lines)
        proc.stdout_thread = threading.Thread(
            target=self._read_stdout, args=(proc,), name="gusset-stdout-%d" % popen.pid, daemon=True
        )
        proc.stderr_thread = threading.Thread(
            target=self._read_stderr, args=(proc,), name="gusset-stderr-%d" % popen.pid, daemon=True
        )
        proc.stderr_thread.start()
        proc.stdout_thread.start()
        return proc

    def _current(self) -> _Process:
        """_current returns the running process, starting a new one if it has died."""
        with self._lock:
            if self._closed:
                raise ClientClosed("The gusset client is closed; make a new Client.")
            proc = self._proc
            if proc is None or proc.dead or proc.popen.poll() is not None:
                if proc is not None:
                    log.info("gusset: process %d has ended; starting a new one", proc.popen.pid)
                proc = self._spawn()
                self._proc = proc
            return proc

    def close(self, timeout: float = 5.0) -> None:
        """close ends the process and waits for it.

        The server answers the requests in flight before it exits; after
        ``timeout`` seconds it is killed and those still in flight fail with
        ProcessDied. Later calls raise ClientClosed. Closing twice is
        harmless.
        """
        with self._lock:
            if self._closed:
                return
            self._closed = True
            proc = self._proc
        if proc is None:
            return
        with proc.write_lock:
            try:
                proc.popen.stdin.close()  # type: ignore[union-attr]
            except OSError:
                pass
        try:
            proc.popen.wait(timeout)
        except subprocess.TimeoutExpired:
            log.warning("gusset: process %d did not stop within %g s; killing it", proc.popen.pid, timeout)
            proc.popen.kill()
            proc.popen.wait()
        if proc.stdout_thread is not None and proc.stdout_thread is not threading.current_thread():
            proc.stdout_thread.join(timeout)

    def __enter__(self) -> "Client":
        return self

    def __exit__(self, *exc: Any) -> None:
        self.close()

    def __repr__(self) -> str:
        return "<gusset.Client %s pid=%s>" % (self.binary, self.pid)

    # Requests.

    def start(
        self,
        method: str,
        params: Optional[Mapping[str, Any]] = None,
        *,
        timeout: Optional[float] = None,
        on_progress: Optional[Callable[[Progress], None]] = None,
        keep_progress: bool = True,
        call_type: type = Call,
    ) -> Call:
        """start sends a request and returns at once with its :class:`Call`.

        Args:
            method: the method name ("solve", "sweep-parameter", ...).
            params: the method's params (a JSON object); None sends {}.
            timeout: seconds to wait for the answer, counted from now;
                default the client's timeout. On expiry the request is
                cancelled and RequestTimeout raised to the waiter.
            on_progress: called with each Progress from the client's reader
                thread; it must return quickly and must not wait on this
                client.
            keep_progress: queue the notifications for iteration over the
                call; False drops them (after on_progress).
            call_type: Call or a subclass (Sweep) to return.

        Raises:
            ClientClosed: the client is closed.
            GussetNotFound: a new process was needed and could not start.
            LimitExceeded: the request is longer than the server's line
                limit.
            ValueError, TypeError: params cannot be encoded as JSON (NaN,
                infinity, or an object json cannot encode).
        """
        with self._lock:
            request_id = next(self._ids)
        message: Dict[str, Any] = {"jsonrpc": "2.0", "id": request_id, "method": method}
        if params is not None:
            message["params"] = params
        line = json.dumps(message, separators=(",", ":"), allow_nan=False).encode("utf-8") + b"\n"
        call = call_type(
            self,
            request_id,
            method,
            self.timeout if timeout is None else timeout,
            keep_progress,
            on_progress,
        )
        for _ in range(3):
            proc = self._current()
            if len(line) > _CHECK_LINE_BYTES and method != "describe":
                self._check_size(proc, len(line) - 1, method, request_id)
            with proc.lock:
                if proc.dead:
                    continue
                proc.pending[request_id] = call
                proc.sending.add(request_id)
                call._process = proc
            delivered = self._write(proc, line)
            with proc.lock:
                proc.sending.discard(request_id)
                if delivered:
                    orphaned = proc.dead and proc.pending.pop(request_id, None) is call
                else:
                    # Nothing was read, so the request can go to a new
                    # process; this one can take no more.
                    proc.pending.pop(request_id, None)
                    proc.dead = True
                    continue
            if orphaned:  # the process ended while the line was being written
                call._finish(None, self._died_error(proc, call))
            return call
        raise ProcessDied("The gusset process keeps dying at start; see its standard error.",
                          request_id=request_id, method=method)

    def call(
        self,
        method: str,
        params: Optional[Mapping[str, Any]] = None,
        timeout: Optional[float] = None,
        on_progress: Optional[Callable[[Progress], None]] = None,
    ) -> Any:
        """call sends a request and waits for its result.

        See :meth:`start` for the arguments.

        Raises:
            GussetError: a subclass per wire code (InvalidParams,
                InvalidModel, UnstableStructure, ...), or RequestTimeout,
                ProcessDied, ProtocolError, ClientClosed.
        """
        return self.start(method, params, timeout=timeout, on_progress=on_progress, keep_progress=False).result()

    def cancel(self, target: Union[Call, int], timeout: Optional[float] = None) -> bool:
        """cancel asks the server to stop a request in flight.

        ``target`` is a Call or a request id. It returns True when the
        request was in flight (it then ends with :class:`Cancelled`) and
        False when it had already been answered.
        """
        if isinstance(target, Call):
            if target.done():
                return False
            request_id = target.id
        else:
            request_id = target
        result = self.call("cancel", {"request": request_id}, timeout=timeout)
        return bool(isinstance(result, dict) and result.get("cancelled"))

    def _write(self, proc: _Process, line: bytes) -> bool:
        """_write sends one line; False means the process can read no more."""
        with proc.write_lock:
            try:
                stdin = proc.popen.stdin
                assert stdin is not None
                stdin.write(line)
                stdin.flush()
                return True
            except (OSError, ValueError):
                pass
        # Make sure the process is gone, so that its reader sees the end of
        # output and fails what is in flight.
        if proc.popen.poll() is None:
            try:
                proc.popen.kill()
            except OSError:
                pass
        return False

    def _check_size(self, proc: _Process, size: int, method: str, request_id: int) -> None:
        if proc.max_line_bytes is None:
            limits = self.call("describe").get("limits", {})
            proc.max_line_bytes = int(limits.get("max_line_bytes", 0)) or None
        if proc.max_line_bytes is not None and size > proc.max_line_bytes:
            raise LimitExceeded(
                "The %s request is %d bytes long, more than the server's line limit of %d bytes. "
                "Start the client with args=['--max-line-bytes', '%d'] or send a smaller model."
                % (method, size, proc.max_line_bytes, size),
                detail={"limit": proc.max_line_bytes, "value": size},
                request_id=request_id,
                method=method,
            )

    def _give_up(self, call: Call, seconds: Optional[float]) -> None:
        """_give_up fails a call that timed out and cancels it on the server."""
        proc = call._process
        if proc is None:
            return
        with proc.lock:
            mine = proc.pending.get(call.id) is call
            if mine:
                del proc.pending[call.id]
                proc.abandoned.add(call.id)
        if not mine:
            return  # answered meanwhile
        if not proc.dead:
            try:
                with self._lock:
                    cancel_id = next(self._ids)
                cancel = Call(self, cancel_id, "cancel", None, False, None)
                with proc.lock:
                    proc.pending[cancel_id] = cancel
                    proc.abandoned.add(cancel_id)
                line = json.dumps({"jsonrpc": "2.0", "id": cancel_id, "method": "cancel",
                                   "params": {"request": call.id}}, separators=(",", ":")).encode() + b"\n"
                self._write(proc, line)
            except Exception:  # the timeout is what the caller needs to hear about
                log.debug("gusset: could not send the cancel of request %d", call.id, exc_info=True)
        call._finish(None, RequestTimeout(
            "No answer to %s (request %d) within %s; the request was cancelled."
            % (call.method, call.id, "the timeout" if seconds is None else "%g s" % seconds),
            request_id=call.id, method=call.method))

    # Reading.

    def _read_stdout(self, proc: _Process) -> None:
        stream = proc.popen.stdout
        assert stream is not None
        try:
            for raw in stream:
                self._dispatch(proc, raw)
        except Exception:
            log.exception("gusset: reading the output of process %d failed", proc.popen.pid)
        finally:
            self._ended(proc)

    def _read_stderr(self, proc: _Process) -> None:
        stream = proc.popen.stderr
        assert stream is not None
        try:
            for raw in stream:
                text = raw.decode("utf-8", "replace").rstrip("\r\n")
                proc.stderr_tail.append(text)
                log.debug("gusset[%d]: %s", proc.popen.pid, text)
        except (OSError, ValueError):
            pass
        finally:
            stream.close()

    def _dispatch(self, proc: _Process, raw: bytes) -> None:
        text = raw.strip()
        if not text:
            return
        try:
            message = json.loads(text)
        except ValueError:
            self._garbled(proc, raw, "not JSON")
            return
        if not isinstance(message, dict) or message.get("jsonrpc") != "2.0":
            self._garbled(proc, raw, "not a JSON-RPC 2.0 message")
            return
        if "id" in message and ("result" in message or "error" in message):
            request_id = message["id"]
            if not isinstance(request_id, (int, str, type(None))):
                self._garbled(proc, raw, "an id that is not a number or string")
                return
            with proc.lock:
                call = proc.pending.pop(request_id, None)  # type: ignore[arg-type]
                known = call is not None or request_id in proc.abandoned
                proc.abandoned.discard(request_id)  # type: ignore[arg-type]
            if call is None:
                if request_id is None:
                    log.warning("gusset: the server could not read a request: %s",
                                (message.get("error") or {}).get("message"))
                elif not known:
                    log.warning("gusset: an answer came for request %r, which was not sent", request_id)
                return
            if "error" in message:
                call._finish(None, from_wire(message["error"], request_id, call.method))
            else:
                call._finish(message["result"], None)
            return
        if message.get("method") == "progress" and isinstance(message.get("params"), dict):
            params = message["params"]
            request_id = params.get("request")
            if isinstance(request_id, (int, str)):
                with proc.lock:
                    call = proc.pending.get(request_id)  # type: ignore[arg-type]
                if call is not None:
                    call._progress(Progress(request_id, str(params.get("stage", "")), params.get("done", 0),
                                            params.get("total", 0), params.get("partial")))
            return
        self._garbled(proc, raw, "neither a response nor a progress notification")

    def _garbled(self, proc: _Process, raw: bytes, why: str) -> None:
        """_garbled reports a line that is not a protocol message.

        Such a line may have been an answer, so the requests in flight fail
        with ProtocolError rather than waiting for ever; their real answers,
        if they come, are dropped.
        """
        text = raw.decode("utf-8", "replace").rstrip("\r\n")
        shown = text if len(text) <= 200 else text[:200] + "..."
        log.warning("gusset: process %d wrote a line that is %s: %r", proc.popen.pid, why, shown)
        with proc.lock:
            victims = list(proc.pending.values())
            proc.pending.clear()
            proc.abandoned.update(call.id for call in victims)
        for call in victims:
            call._finish(None, ProtocolError(
                "The gusset process wrote a line that is %s while %s (request %d) was in flight, so its "
                "answer may be lost: %r. Something other than the server is writing to its standard "
                "output, or the binary is not gusset." % (why, call.method, call.id, shown),
                line=text, request_id=call.id, method=call.method))

    def _ended(self, proc: _Process) -> None:
        """_ended fails the requests still in flight once the process's output has ended."""
        try:
            proc.popen.wait(2.0)
        except subprocess.TimeoutExpired:
            proc.popen.kill()
            proc.popen.wait()
        if proc.stderr_thread is not None:
            proc.stderr_thread.join(1.0)
        if proc.popen.stdout is not None:
            proc.popen.stdout.close()
        with proc.write_lock:
            try:
                proc.popen.stdin.close()  # type: ignore[union-attr]
            except OSError:
                pass
        with proc.lock:
            proc.dead = True
            # Requests still being written are left to their senders, which
            # resend them to a new process if the line did not get through.
            victims = [call for call in proc.pending.values() if call.id not in proc.sending]
            for call in victims:
                del proc.pending[call.id]
        for call in victims:
            call._finish(None, self._died_error(proc, call))

    def _died_error(self, proc: _Process, call: Call) -> ProcessDied:
        returncode = proc.popen.returncode
        tail = "\n".join(proc.stderr_tail)
        message = ("The gusset process (pid %d) %s while %s (request %d) was in flight. "
                   "The next call starts a new process."
                   % (proc.popen.pid, _exit_description(returncode), call.method, call.id))
        if tail:
            message += "\nIts last standard-error lines:\n" + tail
        return ProcessDied(message, returncode=returncode, stderr=tail, request_id=call.id, method=call.method)

    # Methods.

    def describe(self, timeout: Optional[float] = None) -> Dict[str, Any]:
        """describe returns the server's name, versions, methods, limits and schema id."""
        return self.call("describe", timeout=timeout)  # type: ignore[no-any-return]

    def methods(self) -> List[str]:
        """methods returns the names of the methods the server offers."""
        return [m["name"] for m in self.describe()["methods"]]

    def solve(
        self,
        model: Model,
        cases: Optional[Sequence[str]] = None,
        *,
        timeout: Optional[float] = None,
        **options: Any,
    ) -> Dict[str, Any]:
        """solve runs a linear-elastic stiffness analysis of ``model``.

        ``cases`` lists the load cases and combinations to report (default
        all). The result holds, per case, displacements, axial forces,
        reactions, stresses and utilisation, aligned with the model's
        arrays, and the stability report. Tension is positive.
        ``second_order={"tolerance": 1e-6, "max_iterations": 50}`` (either
        field optional) asks for a P-Delta analysis; it and one-sided
        members (cables, ``behaviour``) add an ``iteration`` report per
        case (see ``slack_members`` and ``amplification``).
        """
        return self.call("solve", _whole(model, cases=cases, **options), timeout)  # type: ignore[no-any-return]

    def reciprocate(
        self,
        model: Model,
        *,
        case: Optional[str] = None,
        forces: Optional[Sequence[float]] = None,
        self_stress: Optional[int] = None,
        perpendicular: Optional[bool] = None,
        picture: Optional[bool] = None,
        edit: Optional[Mapping[str, Any]] = None,
        timeout: Optional[float] = None,
        **options: Any,
    ) -> Dict[str, Any]:
        """reciprocate builds the reciprocal force diagram of a planar model.

        With ``edit`` ({"points": {label: [x, y]}, "fixed": [node ids]}) it
        runs the reverse direction: the form whose members are parallel to
        the edited force diagram.
        """
        params = _whole(model, case=case, forces=forces, self_stress=self_stress,
                        perpendicular=perpendicular, picture=picture, edit=edit, **options)
        return self.call("reciprocate", params, timeout)  # type: ignore[no-any-return]

    def load_path(
        self,
        model: Model,
        *,
        cases: Optional[Sequence[str]] = None,
        forces: Optional[Sequence[float]] = None,
        sizing: Optional[Mapping[str, Any]] = None,
        floor_area: Optional[float] = None,
        timeout: Optional[float] = None,
        **options: Any,
    ) -> Dict[str, Any]:
        """load_path computes Maxwell's load path and, with ``sizing``, volume, mass and carbon."""
        params = _whole(model, cases=cases, forces=forces, sizing=sizing, floor_area=floor_area, **options)
        return self.call("load-path", params, timeout)  # type: ignore[no-any-return]

    def sweep(
        self,
        model: Model,
        parameters: Optional[Union[Mapping[str, Any], Sequence[Mapping[str, Any]]]] = None,
        *,
        metrics: Optional[Sequence[str]] = None,
        cases: Optional[Sequence[str]] = None,
        sizing: Optional[Mapping[str, Any]] = None,
        objective: Optional[Mapping[str, Any]] = None,
        shard: Optional[Mapping[str, Any]] = None,
        steps: Optional[str] = None,
        timeout: Optional[float] = None,
        **options: Any,
    ) -> Sweep:
        """sweep starts a sweep-parameter request and returns its :class:`Sweep`.

        ``parameters`` is one axis ({"name": "depth", "from": 1, "to": 4,
        "count": 31} or {"name": ..., "values": [...]}) or a list of one or
        two. Iterate over the returned Sweep for the steps as they stream;
        call its result() for the final result.
        """
        params = _whole(model, parameters=_axes(parameters), metrics=metrics, cases=cases, sizing=sizing,
                        objective=objective, shard=shard, steps=steps, **options)
        call = self.start("sweep-parameter", params, timeout=timeout, call_type=Sweep)
        assert isinstance(call, Sweep)
        return call

    def sweep_parameter(
        self,
        model: Model,
        parameters: Optional[Union[Mapping[str, Any], Sequence[Mapping[str, Any]]]] = None,
        *,
        timeout: Optional[float] = None,
        on_step: Optional[Callable[[Any], None]] = None,
        **options: Any,
    ) -> Dict[str, Any]:
        """sweep_parameter runs a sweep and waits for its final result.

        It takes the arguments of :meth:`sweep`; ``on_step`` is called with
        each step as it streams (from the reader thread).
        """
        on_progress = None
        if on_step is not None:
            step_callback = on_step

            def on_progress(item: Progress) -> None:
                if item.stage == "step" and item.partial is not None:
                    step_callback(item.partial)

        params = _whole(model, parameters=_axes(parameters), **options)
        return self.call("sweep-parameter", params, timeout, on_progress)  # type: ignore[no-any-return]

    def optimise_layout(
        self,
        params: Optional[Mapping[str, Any]] = None,
        *,
        supports: Optional[Sequence[Mapping[str, Any]]] = None,
        cases: Optional[Sequence[Mapping[str, Any]]] = None,
        tension_limit: Optional[float] = None,
        compression_limit: Optional[float] = None,
        domain: Optional[Mapping[str, Any]] = None,
        divisions: Optional[Sequence[int]] = None,
        nodes: Optional[Sequence[Sequence[float]]] = None,
        connectivity: Optional[int] = None,
        joint_cost: Optional[float] = None,
        units: Optional[Mapping[str, str]] = None,
        picture: Optional[bool] = None,
        dimension: Optional[int] = None,
        on_round: Optional[Callable[[Dict[str, Any]], None]] = None,
        timeout: Optional[float] = None,
        **options: Any,
    ) -> Dict[str, Any]:
        """optimise_layout finds the least-volume pin-jointed layout over a ground structure.

        dimension 3 makes a space layout: points, divisions and forces then
        have three entries, and the domain is a box or a convex polyhedron.
        joint_cost, a length added to every member in the objective, makes
        layouts with fewer members win when the saving outweighs the extra
        volume; the result's "objective" includes it, "volume" does not.
        on_round, when given, receives each member-adding round as it ends
        (iteration, members, added, volume, max_violation, violators).
        """
        on_progress = None
        if on_round is not None:
            round_callback = on_round

            def on_progress(item: Progress) -> None:
                if item.stage == "member adding" and item.partial is not None:
                    round_callback(item.partial)

        whole = dict(params or {})
        whole.update(_params(supports=supports, cases=cases, tension_limit=tension_limit,
                             compression_limit=compression_limit, domain=domain, divisions=divisions, nodes=nodes,
                             connectivity=connectivity, joint_cost=joint_cost, units=units, picture=picture,
                             dimension=dimension, **options))
        return self.call("optimise-layout", whole, timeout, on_progress)  # type: ignore[no-any-return]

    def modes(
        self,
        model: Model,
        kind: Optional[str] = None,
        *,
        case: Optional[str] = None,
        count: Optional[int] = None,
        shift: Optional[float] = None,
        picture: Optional[bool] = None,
        timeout: Optional[float] = None,
        **options: Any,
    ) -> Dict[str, Any]:
        """modes finds linear buckling load factors or natural frequencies with their mode shapes.

        ``kind`` is "buckling" (the factors λ of load case ``case`` at which
        (K + λ·K_G)·φ = 0; negative ones mean the loads reversed) or
        "vibration" (frequencies in Hz of (K − ω²·M)·φ = 0, with mass from
        the materials' mass_density and the nodes' mass; participation
        factors and effective masses per direction). ``count`` modes
        nearest ``shift`` (a load factor, or a frequency in Hz) are found.
        These are linear results of the perfect structure: imperfections,
        nonlinearity and the design codes govern real design.
        """
        params = _whole(model, kind=kind, case=case, count=count, shift=shift, picture=picture, **options)
        return self.call("modes", params, timeout)  # type: ignore[no-any-return]

    def find_form(
        self,
        model: Model,
        *,
        force_density: Optional[Union[float, str]] = None,
        force_densities: Optional[Sequence[Union[float, str]]] = None,
        case: Optional[str] = None,
        through: Optional[Mapping[str, Any]] = None,
        targets: Optional[Sequence[Mapping[str, Any]]] = None,
        picture: Optional[bool] = None,
        timeout: Optional[float] = None,
        on_iteration: Optional[Callable[[Any], None]] = None,
        **options: Any,
    ) -> Dict[str, Any]:
        """find_form finds the equilibrium form of a network by the force density method.

        Give ``force_density`` (one q = N/L for every member, tension
        positive) or ``force_densities`` (one per member, numbers or
        expressions). ``through`` ({"node": id, "at": [x, y(, z)]}) scales
        them so that the node passes through the point; ``targets`` lists
        {"member": id, "length": L} or {"member": id, "force": N}. The
        result's "model" is the found form, ready for solve and load-path
        (its load case "model_case"). ``on_iteration`` is called with each
        iteration's {"iteration", "change", "misfit"} as it streams.
        """
        on_progress = None
        if on_iteration is not None:
            iteration_callback = on_iteration

            def on_progress(item: Progress) -> None:
                if item.stage == "iterating" and item.partial is not None:
                    iteration_callback(item.partial)

        params = _whole(model, force_density=force_density, force_densities=force_densities, case=case,
                        through=through, targets=targets, picture=picture, **options)
        return self.call("find-form", params, timeout, on_progress)  # type: ignore[no-any-return]


def _params(**fields: Any) -> Dict[str, Any]:
    """_params drops the fields left as None, so the server applies its defaults."""
    return {name: value for name, value in fields.items() if value is not None}


def _whole(first: Any, **fields: Any) -> Dict[str, Any]:
    """_whole builds a model method's params from its first argument and keywords.

    Every method takes its whole params dict positionally, as on the wire
    (a mapping with a "model" key), or the model itself; the keywords given
    (not None) are added to, or replace, the dict's entries.
    """
    if isinstance(first, Mapping) and "model" in first:
        params = dict(first)
    else:
        params = {"model": first}
    params.update(_params(**fields))
    return params


def _axes(parameters: Optional[Union[Mapping[str, Any], Sequence[Mapping[str, Any]]]]) -> Optional[List[Mapping[str, Any]]]:
    if parameters is None:
        return None
    if isinstance(parameters, Mapping):
        return [parameters]
    return list(parameters)


def _exit_description(returncode: Optional[int]) -> str:
    if returncode is None:
        return "closed its output"
    if returncode < 0:
        try:
            name = signal.Signals(-returncode).name
        except ValueError:
            name = "signal %d" % -returncode
        return "was killed by %s" % name
    return "exited with status %d" % returncode
