package envelope

// SafetyNote is the general caution of every view of the results: the
// help screen, the header of a text dump and of a run list. PlanningNote
// (solve.go) is the one attached to each facility answer.
const SafetyNote = "Results are planning estimates. Pressure vessels, cryogenic nitrogen " +
	"and model loads need the facility's own procedures, local codes and " +
	"licensed engineering practice."
