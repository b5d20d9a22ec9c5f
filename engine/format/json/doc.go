// Package json writes seatsmith's result documents in their JSON form,
// indented by two spaces, with exact numbers as jsondoc writes them. A
// document whose tree has one large array made item by item (the units
// of an allotment, the sizes of a sweep) is written without building that
// array: each item is made, written and dropped, and the bytes are those
// of the whole tree marshalled.
package json
