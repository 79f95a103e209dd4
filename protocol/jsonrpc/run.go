package jsonrpc

import (
	"context"
	"errors"
	"fmt"
	"runtime/debug"
	"time"

	"gusset/protocol"
)

var (
	errCancelledByHost = errors.New("cancelled by a cancel request")
	errTimeLimit       = errors.New("time limit")
)

// run executes one call with panic recovery and maps its outcome to the
// final response.
func (c *conn) run(cl *call) (resp *protocol.Response) {
	defer func() {
		if r := recover(); r != nil {
			c.s.logf("panic in %s: %v\n%s", cl.method, r, debug.Stack())
			resp = errorResponse(cl.id, protocol.NewError(protocol.CodeInternal, "internal error",
				fmt.Sprintf("Gusset failed inside %s (%v). This is a bug: please report it with the request. The server goes on.", cl.method, r)))
		}
	}()
	if err := context.Cause(cl.ctx); err != nil {
		return errorResponse(cl.id, c.contextError(cl.ctx))
	}
	// The time limit counts from when a worker takes the request, so a
	// request queued behind long work is not charged for the wait.
	ctx := cl.ctx
	if c.limits.TimeLimitSeconds > 0 {
		var stop context.CancelFunc
		ctx, stop = context.WithTimeoutCause(ctx, time.Duration(c.limits.TimeLimitSeconds*float64(time.Second)), errTimeLimit)
		defer stop()
	}
	c.mu.Lock()
	cl.start = time.Now()
	c.mu.Unlock()
	result, err := c.s.methods[cl.method](ctx, cl.takeParams(), &stream{c: c, cl: cl})
	return c.outcome(ctx, cl, result, err)
}

// outcome maps a handler's result or error to the final response: a
// stopped context wins over a result, and an error is classified.
func (c *conn) outcome(ctx context.Context, cl *call, result any, err error) *protocol.Response {
	if err == nil {
		if ctx.Err() != nil && context.Cause(ctx) != nil && !errors.Is(context.Cause(ctx), context.Canceled) {
			return errorResponse(cl.id, c.contextError(ctx))
		}
		return &protocol.Response{JSONRPC: "2.0", ID: cl.id, Result: result}
	}
	if ctx.Err() != nil && (errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded)) {
		return errorResponse(cl.id, c.contextError(ctx))
	}
	classify := c.s.Classify
	if classify == nil {
		classify = DefaultClassify
	}
	return errorResponse(cl.id, classify(err))
}

// contextError says why a request's context stopped.
func (c *conn) contextError(ctx context.Context) *protocol.Error {
	cause := context.Cause(ctx)
	switch {
	case errors.Is(cause, errTimeLimit):
		return protocol.NewError(protocol.CodeTimeLimit, "time limit", fmt.Sprintf("The request ran longer than the time limit of %g s and was stopped. Start the server with a larger --time-limit or send a smaller model.", c.limits.TimeLimitSeconds))
	case errors.Is(cause, errCancelledByHost):
		return protocol.NewError(protocol.CodeCancelled, "cancelled", "The request was cancelled by a cancel request.")
	case errors.Is(cause, ErrInterrupted):
		return protocol.NewError(protocol.CodeCancelled, "cancelled", fmt.Sprintf("The request was cancelled: the server was told to stop (%v).", cause))
	default:
		return protocol.NewError(protocol.CodeShuttingDown, "shutting down", fmt.Sprintf("The request was stopped because the server is stopping (%v).", cause))
	}
}
