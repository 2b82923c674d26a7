using CableFault.Analysis;
using CableFault.Tests.Cli;
using CableFault.Tests.Hardening;
using CableFault.Workflows;

namespace CableFault.Tests.Workflows;

/// <summary>
/// Seeded mutations of the shipped as-built list: the reader either refuses with an <see cref="InputException"/> or
/// returns a list the matcher can use (finite distances, positive tolerances), never anything else.
/// </summary>
public sealed class AsBuiltFuzzTests
{
    /// <summary>Cases run: a few seconds on one core; each mutation kind (bytes, numbers, structure) comes up hundreds of times.</summary>
    private const int Cases = 5_000;

    [Fact]
    public void MutatedListsAreReadOrRefusedCleanly()
    {
        byte[] original = File.ReadAllBytes(Path.Combine(CliRunner.RepositoryRoot(), "traces", "quillon-bay", "mast-feeder.asbuilt.json"));
        LocatedEvent[] events =
        [
            new(12.0, 0.24, EventKind.Inductive, 0.01, null, 4e-9, 1, 121e-9),
            new(42.5, 0.85, EventKind.Open, 1, null, null, 1, 430e-9),
        ];
        FuzzHarness.Run("as-built JSON", 7_000_000, Cases, seed =>
        {
            var list = AsBuiltJson.Read(new MemoryStream(FuzzMutator.Mutate(original, seed)), "fuzz.json");
            Assert.All(list.Entries, e =>
            {
                Assert.True(double.IsFinite(e.DistanceMeters) && e.DistanceMeters >= 0, $"seed {seed}: distance {e.DistanceMeters}");
                Assert.True(double.IsFinite(e.ToleranceMeters) && e.ToleranceMeters > 0, $"seed {seed}: tolerance {e.ToleranceMeters}");
                Assert.NotEmpty(e.AcceptedKinds);
            });
            var match = AsBuiltMatcher.Match(events, list, reachMeters: 50);
            Assert.Equal(list.Entries.Count, match.ExpectedCount + match.Missing.Count);
        });
    }
}
