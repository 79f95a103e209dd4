// Package adapter is the thin layer that maps protocol requests to engine
// calls and engine results and errors back to wire types. It is the only
// package that imports both protocol and engine.
package adapter
