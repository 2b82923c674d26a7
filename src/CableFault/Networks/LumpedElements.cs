namespace CableFault.Networks;

/// <summary>A capacitance from conductor to return at one point (crushed or wet spot, a stub), F.</summary>
public sealed record ShuntCapacitor(double CapacitanceFarads) : NetworkElement;

/// <summary>An inductance in series with the conductor at one point (a loose or long splice), H.</summary>
public sealed record SeriesInductor(double InductanceHenries) : NetworkElement;

/// <summary>A resistance from conductor to return at one point (insulation breakdown, water: a partial short), Ω.</summary>
public sealed record ShuntResistor(double ResistanceOhms) : NetworkElement;

/// <summary>A resistance in series with the conductor at one point (a corroded or high-resistance joint), Ω.</summary>
public sealed record SeriesResistor(double ResistanceOhms) : NetworkElement;
