using System.Globalization;
using System.Text.RegularExpressions;
using CableFault.Analysis;
using CableFault.Networks;
using static CableFault.Tests.Analysis.Locate.LocateFixtures;

namespace CableFault.Tests.Analysis.Locate;

/// <summary>A technician who asked for feet reads the warnings' distances in feet too.</summary>
public class WarningUnitTests
{
    /// <summary>
    /// A 300 m run is a long record (over 200 rise times), so locate warns how close two events may lie and still show as
    /// one. With feet asked for, that distance is the metre figure over 0.3048 m/ft (the international foot, exact by
    /// definition), to the three decimals printed, and no warning names a distance in metres.
    /// </summary>
    [Fact]
    public void LongRecordWarningGivesItsDistanceInFeetWhenAsked()
    {
        var trace = Simulate(Run(Segment(300), RunEnd.Open));
        var inMeters = Locator.Locate(trace, Options());
        var inFeet = Locator.Locate(trace, Options() with { WarningsInFeet = true });

        double meters = Distance(inMeters.Warnings, "m");
        double feet = Distance(inFeet.Warnings, "ft");

        Assert.InRange(feet, meters / 0.3048 - 0.002, meters / 0.3048 + 0.002);
        Assert.DoesNotContain(inFeet.Warnings, w => Regex.IsMatch(w, @"\d m\b"));
    }

    /// <summary>The "events closer than about X unit may show as one" figure of the long-record warning.</summary>
    private static double Distance(IEnumerable<string> warnings, string unit)
    {
        var match = warnings.Select(w => Regex.Match(w, @"closer than about ([0-9.]+) " + unit + " may show as one"))
            .FirstOrDefault(m => m.Success);
        Assert.True(match is not null, $"no long-record warning in {unit}: {string.Join(" | ", warnings)}");
        return double.Parse(match.Groups[1].Value, CultureInfo.InvariantCulture);
    }
}
