// Public shapes of the geotherm API (issue 3). Units are in every name; heat flow in mW/m² and heat
// production in µW/m³ at this boundary, SI (W/m², W/m³) inside the solvers.

/** One layer of a 1-D conductive crust or lithosphere, top to bottom. */
export interface CrustLayer {
	thicknessM: number; // > 0
	conductivityWmK: number; // k0: conductivity at 0 °C, > 0
	heatProductionUWm3: number; // at the top of the layer, >= 0
	heatProductionDecayM?: number; // if set: A(z) = A_top * exp(-(z - z_top) / decay) inside the layer
	conductivityTempCoeffPerK?: number; // if set: k(T) = k0 / (1 + b T), b >= 0
}

/** A steady 1-D geotherm problem: surface temperature, one boundary heat flow, layers. */
export interface GeothermInput {
	surfaceTemperatureC: number;
	surfaceHeatFlowMWm2?: number; // give exactly one of these two
	basalHeatFlowMWm2?: number; // heat flow at the base of the last layer
	layers: CrustLayer[]; // top to bottom; the profile ends at the base of the last layer
	depthStepM?: number; // output spacing, default 100; samples at every multiple of the step,
	// at every layer boundary, and at the base
}

/** A sampled geotherm. Heat flow is positive upward (out of the ground). */
export interface GeothermProfile {
	depthM: number[];
	temperatureC: number[];
	heatFlowMWm2: number[];
	surfaceHeatFlowMWm2: number;
	basalHeatFlowMWm2: number;
	/** Depth of the base of each input layer, top to bottom (the last one is the profile base). */
	layerBaseDepthsM?: number[];
	/** Allowed but suspicious results (negative heat flow, implausible values); empty when none. */
	warnings?: string[];
}
