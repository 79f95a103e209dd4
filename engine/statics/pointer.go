package statics

import "strconv"

// memberPointer returns the JSON pointer of member e within the model.
func memberPointer(e int) string { return "/members/" + strconv.Itoa(e) }
