namespace CableFault.Tests.Reference.Ngspice;

/// <summary>
/// A theory that needs ngspice: skipped, with the reason shown, when ngspice is not on PATH, except when
/// CABLEFAULT_REQUIRE_NGSPICE=1, where it runs and fails on the missing executable instead.
/// </summary>
public sealed class NgspiceTheoryAttribute : TheoryAttribute
{
    public NgspiceTheoryAttribute()
    {
        if (NgspiceRunner.ExecutablePath is null && !NgspiceRunner.IsRequired)
            Skip = $"ngspice is not on PATH (Debian package ngspice); set {NgspiceRunner.RequireVariable}=1 to make this a failure";
    }
}
