package envelope

import (
	"likewind/atmos"
)

// testSettings are the default tolerances (common practice): Mach within
// 0.01, Reynolds number within 10 %, Mach relaxed below 0.3.
func testSettings() Settings {
	return Settings{MachTol: 0.01, ReTol: 0.10, CompressibilityMach: 0.3, Regimes: atmos.DefaultRegimes()}
}

// cryoTunnel is an invented pressurised cryogenic nitrogen tunnel.
func cryoTunnel() Facility {
	return Facility{Name: "cryogenic test tunnel", Medium: MediumNitrogen, MachMin: 0.2, MachMax: 1.2,
		P0Min: 1.2e5, P0Max: 4.5e5, T0Min: 90, T0Max: 320, QMax: 1.2e5, Condensation: true,
		Width: 2.5, Height: 2.5}
}

// waterTunnel is an invented water tunnel.
func waterTunnel() Facility {
	return Facility{Name: "water test tunnel", Medium: MediumWater, SpeedMin: 1, SpeedMax: 15,
		T0Min: 283.15, T0Max: 313.15, P0Max: 2e5, Width: 1, Height: 1}
}
