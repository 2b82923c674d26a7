using System.Numerics;
using CableFault.FrequencyDomain;

namespace CableFault.Tests.Hardening;

/// <summary>Write-then-read invariants of the Touchstone writer and reader over many seeded random sweeps.</summary>
public class ReaderPropertyTests
{
    private const int Seeds = 150;

    /// <summary>RI is written in round-trip form, so it must come back bit for bit.</summary>
    private const double ExactTolerance = 0;

    /// <summary>MA and DB go through a polar conversion (and DB a log and a power): a few ulps of |Γ| ≤ 1.</summary>
    private const double PolarTolerance = 1e-13;

    public static TheoryData<TouchstoneDataFormat, TouchstoneVersion> Layouts()
    {
        var data = new TheoryData<TouchstoneDataFormat, TouchstoneVersion>();
        foreach (var format in Enum.GetValues<TouchstoneDataFormat>())
            foreach (var version in Enum.GetValues<TouchstoneVersion>())
                data.Add(format, version);
        return data;
    }

    [Theory]
    [MemberData(nameof(Layouts))]
    public void Touchstone_write_then_read_returns_the_same_sweep(TouchstoneDataFormat format, TouchstoneVersion version)
    {
        for (int seed = 1; seed <= Seeds; seed++)
        {
            var random = new Random(seed);
            // Increasing frequencies on an irregular grid from hertz up to (at most) the reader's limit.
            var frequencies = new List<double>();
            int wanted = 1 + random.Next(300);
            for (double f = Math.Pow(10, random.NextDouble() * 9); frequencies.Count < wanted && f <= TouchstoneReader.MaximumFrequencyHz;
                 f += f * Math.Pow(10, -6 + 6 * random.NextDouble()))
                frequencies.Add(f);
            int count = frequencies.Count;
            var gamma = frequencies.Select(_ => random.Next(10) switch
            {
                0 => Complex.Zero,
                1 => new Complex(random.Next(2) == 0 ? 1 : -1, 0),
                _ => Complex.FromPolarCoordinates(random.NextDouble(), (random.NextDouble() - 0.5) * 2 * Math.PI),
            }).ToArray();
            double reference = random.Next(3) switch { 0 => 50, 1 => 75, _ => 1 + 999 * random.NextDouble() };
            var original = new ReflectionData(frequencies, gamma, reference, [$"invented sweep, seed {seed}"]);

            var text = new StringWriter();
            TouchstoneWriter.Write(original, text, format, version);
            var back = TouchstoneReader.Read(new StringReader(text.ToString()), "property.s1p");

            Assert.Equal(frequencies, back.FrequenciesHz.ToArray());
            Assert.Equal(reference, back.ReferenceImpedanceOhms);
            double tolerance = format == TouchstoneDataFormat.RealImaginary ? ExactTolerance : PolarTolerance;
            for (int i = 0; i < count; i++)
            {
                double error = (gamma[i] - back.ReflectionCoefficients[i]).Magnitude;
                Assert.True(error <= tolerance, $"seed {seed}, point {i}: Γ {gamma[i]} came back as {back.ReflectionCoefficients[i]} (error {error:G3})");
            }
        }
    }
}
