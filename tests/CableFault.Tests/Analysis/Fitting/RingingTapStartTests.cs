using CableFault.Analysis;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// The starting model the selection refines: a drop followed by a row of candidates at whole multiples of one round
/// trip Δ is the ringing of an open branch (a junction of three equal lines reflects ρ = −1/3 and the branch end's echo
/// returns every further Δ: Pozar, <i>Microwave Engineering</i>, 4th ed., §2.3 for the open stub, from memory), so it
/// is also started as one tap of branch Δ, not only as a staircase of boundaries the fit must take apart.
/// </summary>
public class RingingTapStartTests
{
    private const double RiseSeconds = 1e-9;

    private static RunModelContext Context() => new(0.66, 50, 50, null, RiseSeconds, 0.5);

    private static EventCandidate Step(double nanoseconds, double rho, double zAfter) =>
        new(nanoseconds * 1e-9, rho, CandidateShape.Step, 50, zAfter);

    [Fact]
    public void DropWithEchoesAtMultiplesOfOneRoundTripStartsAsATap()
    {
        // A tap at 100 ns with a 12 ns branch: the staircase the detector reports (values as a layer peel gives them,
        // alternating about 50 Ω and decaying), then a real open at 300 ns.
        var candidates = new[]
        {
            Step(100, -1.0 / 3, 25), Step(112, +0.5, 75), Step(124, -0.33, 38), Step(136, +0.25, 63), Step(148, -0.2, 42),
            Step(300, +1, double.PositiveInfinity),
        };
        var detected = RunModelBuilder.FromCandidates(Context(), 0.5, RiseSeconds, candidates, 1e-9);
        // Fitted on data smoothed to a 2 ns effective rise: the branch is 6 rises long.
        var model = RunModelBuilder.RingingTapStart(detected, 2e-9);
        Assert.NotNull(model);
        Assert.Equal(2, model.Events.Count);
        Assert.Equal(RunModelElement.Tap, model.Events[0].Element);
        Assert.Equal(12e-9, model.Events[0].Value, 1e-12);
        Assert.Equal(300e-9, model.Events[1].RoundTripSeconds, 1e-12);
    }

    [Fact]
    public void DropFollowedByUnrelatedEventsStaysADrop()
    {
        // Two later events, not a row at multiples of the first gap: a drop and what follows it.
        var candidates = new[] { Step(100, -0.2, 33), Step(130, +0.2, 50), Step(175, +0.3, 93), Step(300, +1, double.PositiveInfinity) };
        var detected = RunModelBuilder.FromCandidates(Context(), 0.5, RiseSeconds, candidates, 1e-9);
        Assert.Null(RunModelBuilder.RingingTapStart(detected, 2e-9));
    }

    [Fact]
    public void LongBranchIsLeftToTheSelection()
    {
        // The same staircase, its echoes 12 ns apart: at a 2 ns effective rise (6 rises) it rings as one; unsmoothed, at
        // the instrument's 1 ns (12 rises, beyond MaximumRingingBranchRiseTimes), the echoes stand apart.
        var candidates = new[] { Step(100, -1.0 / 3, 25), Step(112, +0.5, 75), Step(124, -0.33, 38), Step(136, +0.25, 63), Step(300, +1, double.PositiveInfinity) };
        var detected = RunModelBuilder.FromCandidates(Context(), 0.5, RiseSeconds, candidates, 1e-9);
        Assert.NotNull(RunModelBuilder.RingingTapStart(detected, 2e-9));
        Assert.Null(RunModelBuilder.RingingTapStart(detected, 1e-9));
    }
}
