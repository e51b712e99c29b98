package pipeline

// The built-in step packages register their kinds in init; importing them
// here lets Load rebuild any built-in step with no blank import in the
// user's program.
import (
	_ "github.com/tabprep/tabprep/encode"
	_ "github.com/tabprep/tabprep/impute"
	_ "github.com/tabprep/tabprep/scale"
)
