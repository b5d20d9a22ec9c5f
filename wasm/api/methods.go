package api

import (
	"seatsmith/engine"
	"seatsmith/engine/jsondoc"
)

// methods lists the methods: [{id, name, divisor}], in engine.Methods
// order. id is what a scenario's method member takes; divisor is true for
// divisor methods and false for largest-remainder methods.
func methods(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	if err := noArgument("methods", arg); err != nil {
		return nil, err
	}
	arr := jsondoc.NewArray()
	for _, m := range engine.Methods() {
		arr.Append(object(
			jsondoc.Field{Key: "id", Value: jsondoc.Str(m.String())},
			jsondoc.Field{Key: "name", Value: jsondoc.Str(m.Name())},
			jsondoc.Field{Key: "divisor", Value: jsondoc.Boolean(m.IsDivisor())}))
	}
	return arr, nil
}
