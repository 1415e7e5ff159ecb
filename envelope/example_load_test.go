package envelope_test

import (
	"errors"
	"fmt"

	"likewind/envelope"
)

func ExampleParseVehicle() {
	src := `
[vehicle]
name = "Sketch glider"
reference_length = "1.2 m"
reference_area = "15 m2"
span = "15 m"
frontal_area = "0.5 m2"

[envelope]
speed_kind = "EAS"
boundary = [
  ["0 ft",     "45 kt"],
  ["0 ft",     "140 kt"],
  ["25000 ft", "120 kt"],
  ["25000 ft", "60 kt"],
]
`
	v, err := envelope.ParseVehicle("glider.toml", []byte(src))
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: %d boundary points in %v\n", v.Name, len(v.Boundary), v.BoundaryKind)
	fmt.Printf("reference length %.2f m (%s)\n", v.RefLength, v.RefLengthName)
	fmt.Printf("grid %d × %d, altitude %.0f to %.0f m\n",
		v.Grid.Altitude.Count, v.Grid.Speed.Count, v.Grid.Altitude.Min, v.Grid.Altitude.Max)
	// Output:
	// Sketch glider: 4 boundary points in EAS
	// reference length 1.20 m (reference length)
	// grid 40 × 60, altitude 0 to 7620 m
}

func ExampleParseFacilities_errors() {
	src := `
[[facility]]
name = "Bench tunnel"
medium = "water"
mach_range = ["0.1", "0.3"]
static_pressure_range = ["0.2 bar", "2 bar"]
water_temperature_range = ["10 degC", "120 degC"]
section_width = "0.4"
section_height = "0.4 m"
`
	_, err := envelope.ParseFacilities("bench.toml", []byte(src))
	var fe *envelope.FileErrors
	if errors.As(err, &fe) {
		for _, e := range *fe {
			fmt.Printf("line %d: %s\n", e.Line, e.Field)
		}
	}
	// Output:
	// line 2: facility[1].speed_range
	// line 5: facility[1].mach_range
	// line 7: facility[1].water_temperature_range high
	// line 8: facility[1].section_width
}

func ExampleDemo() {
	v, facs, err := envelope.Demo()
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(v.Name)
	for _, f := range facs {
		fmt.Printf("%-48s %s\n", f.Name, f.Medium)
	}
	// Output:
	// Corvane SX-3 supersonic research aircraft
	// Aldmoor 2.4 m atmospheric tunnel                 air
	// Bracken Ness 3.6 m pressurized low-speed tunnel  air
	// Harl Cove T2 pressurized transonic tunnel        air
	// Kellen Fold cryogenic transonic tunnel           nitrogen
	// Skerrow 0.6 m supersonic blowdown tunnel         air
	// Wenlow 0.5 m water tunnel                        water
}
