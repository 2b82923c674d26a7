using System.Numerics;
using CableFault.Analysis;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// The delay a short section of other impedance adds beyond its length, against the transmission of a lossless line
/// section from its ABCD matrix [cos θ, jZ₁ sin θ; j sin θ/Z₁, cos θ] in a system of Z:
/// S₂₁ = 2/(A + B/Z + C·Z + D) (Pozar, <i>Microwave Engineering</i>, 4th ed., Tables 4.1 and 4.2, from memory). Its group
/// delay −d arg S₂₁/dω at low frequency, less the section's own one-way time ℓ/v, is the excess.
/// </summary>
public class SectionExcessDelayTests
{
    [Theory]
    [InlineData(3.0, 75.0)]   // a spot the fit bent into a few-ohm stretch
    [InlineData(60.0, 75.0)]  // a mild drop
    [InlineData(300.0, 75.0)] // a narrow high-impedance stretch (a series L's stand-in)
    [InlineData(100.0, 50.0)]
    public void ExcessDelayMatchesTheLineSectionsTransmission(double sectionOhms, double lineOhms)
    {
        const double oneWaySeconds = 0.1e-9, omega = 2 * Math.PI * 1e6; // θ = ωℓ/v ≈ 6e-4: the low-frequency limit
        Complex Transmission(double w)
        {
            double theta = w * oneWaySeconds;
            var a = new Complex(Math.Cos(theta), 0);
            var b = new Complex(0, sectionOhms * Math.Sin(theta));
            var c = new Complex(0, Math.Sin(theta) / sectionOhms);
            return 2 / (a + b / lineOhms + c * lineOhms + a);
        }
        double dw = omega * 1e-3;
        double groupDelay = -(Transmission(omega + dw) / Transmission(omega - dw)).Phase / (2 * dw);

        double excess = ReactiveSections.SectionExcessDelaySeconds(sectionOhms, lineOhms, 2 * oneWaySeconds);

        // Corrections are of order θ² ≈ 4e-7 relative; the central difference's are (dω/ω)² = 1e-6.
        Assert.Equal(groupDelay - oneWaySeconds, excess, Math.Abs(excess) * 1e-4 + 1e-20);
    }
}
