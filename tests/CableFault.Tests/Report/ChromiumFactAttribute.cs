namespace CableFault.Tests.Report;

/// <summary>
/// A fact that needs Chromium: skipped, with the reason shown, when no chromium is on PATH, except when
/// CABLEFAULT_REQUIRE_CHROMIUM=1 (set by .ci/run), where it runs and fails on the missing browser instead.
/// </summary>
public sealed class ChromiumFactAttribute : FactAttribute
{
    public ChromiumFactAttribute()
    {
        if (BrowserCheck.BrowserPath is null && !BrowserCheck.IsRequired)
            Skip = $"chromium is not on PATH (Debian package chromium); set {BrowserCheck.RequireVariable}=1 to make this a failure";
    }
}

/// <summary>The theory twin of <see cref="ChromiumFactAttribute"/>: skipped with the reason shown when chromium is missing,
/// failed instead when CABLEFAULT_REQUIRE_CHROMIUM=1.</summary>
public sealed class ChromiumTheoryAttribute : TheoryAttribute
{
    public ChromiumTheoryAttribute()
    {
        if (BrowserCheck.BrowserPath is null && !BrowserCheck.IsRequired)
            Skip = $"chromium is not on PATH (Debian package chromium); set {BrowserCheck.RequireVariable}=1 to make this a failure";
    }
}
