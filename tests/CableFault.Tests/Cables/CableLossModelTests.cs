using CableFault.Cables;

namespace CableFault.Tests.CableTypeChecks;

public class CableLossModelTests
{
    /// <summary>The model is A(f) = k_c√f + k_d f; fitting two data-sheet points must reproduce both exactly (up to rounding).</summary>
    private const double ReproductionToleranceDb = 1e-9;

    [Theory]
    [InlineData(16.0, 100e6, 60.0, 1e9)]
    [InlineData(6.5, 10e6, 22.0, 100e6)]
    [InlineData(60.0, 1e9, 16.0, 100e6)]
    public void TwoPointFitReproducesBothPoints(double a1, double f1, double a2, double f2)
    {
        var loss = CableLossModel.FromDatasheet(a1, f1, a2, f2);
        Assert.Equal(a1, loss.AttenuationDbPer100m(f1), ReproductionToleranceDb);
        Assert.Equal(a2, loss.AttenuationDbPer100m(f2), ReproductionToleranceDb);
    }

    [Fact]
    public void OnePointIsAllSkinLossAndScalesAsRootF()
    {
        // Skin-effect loss grows as √f (Pozar, Microwave Engineering 4th ed., §2.7): 4× the frequency doubles it.
        var loss = CableLossModel.FromDatasheet(10, 25e6);
        Assert.Equal(0, loss.DielectricLossNepersPerMeterPerHertz);
        Assert.Equal(20, loss.AttenuationDbPer100m(100e6), 1e-9);
    }

    [Fact]
    public void InconsistentPointsAreClampedToNonNegativeCoefficients()
    {
        // Loss that falls with frequency is unphysical; the fit must not produce negative attenuation anywhere.
        var loss = CableLossModel.FromDatasheet(20, 10e6, 10, 100e6);
        Assert.True(loss.SkinLossNepersPerMeterPerRootHertz >= 0);
        Assert.True(loss.DielectricLossNepersPerMeterPerHertz >= 0);
        Assert.True(loss.AttenuationDbPer100m(1e9) >= 0);
    }

    [Fact]
    public void NeperDecibelConversionMatchesDefinition()
    {
        // 1 Np = 20·log10(e) dB (IEC 60027-3 / ISO 80000-3 definition of the neper and decibel).
        double decibelsPerNeper = 1 / CableLossModel.NepersPerDecibel;
        Assert.Equal(20 * Math.Log10(Math.E), decibelsPerNeper, 12);
    }

    [Fact]
    public void EveryBuiltInTypeIsValidAndNamesItsSource()
    {
        foreach (var type in BuiltInCableTypes.All)
        {
            Assert.Empty(type.Problems());
            Assert.False(string.IsNullOrWhiteSpace(type.Source), $"{type.Designation} has no source note");
        }
    }

    [Theory]
    [InlineData("rg58", "RG-58")]
    [InlineData("Cat 5e", "CAT5E")]
    [InlineData("rg_213", "RG-213")]
    public void LibraryFindsDesignationsLoosely(string asked, string expected)
    {
        Assert.Equal(expected, CableLibrary.BuiltIn.Find(asked)?.Designation);
    }

    [Fact]
    public void UnknownCableIsAnInputErrorListingKnownTypes()
    {
        var error = Assert.Throws<InputException>(() => CableLibrary.BuiltIn.Get("RG-999"));
        Assert.Contains("RG-999", error.Message);
        Assert.Contains("RG-58", error.Message);
    }

    [Fact]
    public void CableFileRoundTrips()
    {
        var original = new CableType("SITE-FEEDER", "foam feeder", 50, 0.83, CableLossModel.FromDatasheet(3.5, 100e6, 12.5, 1e9, 0.001),
            InsulationClass.FoamPolyethylene, "data sheet");
        using var stream = new MemoryStream();
        CableTypeJson.Write([original], stream);
        stream.Position = 0;
        var read = Assert.Single(CableTypeJson.Read(stream, "cables.json"));
        Assert.Equal(original.ImpedanceOhms, read.ImpedanceOhms);
        Assert.Equal(original.VelocityFactor, read.VelocityFactor);
        Assert.Equal(original.InsulationClass, read.InsulationClass);
        foreach (double f in new[] { 1e6, 100e6, 3e9 })
            Assert.Equal(original.Loss.AttenuationDbPer100m(f), read.Loss.AttenuationDbPer100m(f), 1e-6);
    }
}
