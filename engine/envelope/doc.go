// Package envelope keeps, over a set of load cases and combinations solved
// by package stiffness, the largest and the smallest value of every result
// per node, support and member, each with the case that governs it: the
// envelope a designer checks a member or a joint against.
//
// An Envelope is filled one case at a time (Add), so a caller may fold
// each case in as soon as it is recovered and drop it; it holds a fixed
// amount of memory per node and member whatever the number of cases. A
// member whose utilisation could not be checked in any enveloped case
// keeps that case (Member.Unchecked): its enveloped utilisation is then
// not a result a person may build from, and says so.
package envelope
