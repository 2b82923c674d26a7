using System.Diagnostics;
using System.Text;
using System.Text.RegularExpressions;
using SkiaSharp;

namespace CableFault.Tests.Report;

/// <summary>Runs tests/report-browser-check.sh (headless Chromium: print to PDF, screenshot to PNG) and reads what it wrote.</summary>
internal static partial class BrowserCheck
{
    /// <summary>Environment variable that turns a missing chromium from a skip into a failure (.ci/run sets it to 1).</summary>
    internal const string RequireVariable = "CABLEFAULT_REQUIRE_CHROMIUM";

    /// <summary>Folder to keep the PDF and PNG in for a person to look at; unset, they go to a temporary folder.</summary>
    internal const string KeepVariable = "CABLEFAULT_BROWSER_OUTPUT";

    /// <summary>Safety net against a hung browser, not a performance check.</summary>
    private static readonly TimeSpan Timeout = TimeSpan.FromMinutes(10);

    internal static bool IsRequired => Environment.GetEnvironmentVariable(RequireVariable) == "1";

    internal static string? BrowserPath { get; } = Environment.GetEnvironmentVariable("CABLEFAULT_CHROMIUM") is { Length: > 0 } set && File.Exists(set)
        ? set : FindOnPath("chromium") ?? FindOnPath("chromium-browser");

    internal sealed record Rendering(byte[] Pdf, byte[] Png, string Folder);

    /// <summary>Writes <paramref name="html"/> to <paramref name="name"/>.html and renders it at the given window size.</summary>
    internal static Rendering Render(string html, string name, int widthPixels, int heightPixels)
    {
        if (BrowserPath is null)
            throw new InvalidOperationException($"chromium is not on PATH but {RequireVariable}=1 requires it (Debian: apt-get install -y chromium).");
        string keep = Environment.GetEnvironmentVariable(KeepVariable) ?? "";
        string folder = keep.Length > 0 ? Path.Combine(keep, name) : Path.Combine(Path.GetTempPath(), "cablefault-browser-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        try
        {
            string page = Path.Combine(folder, name + ".html");
            File.WriteAllText(page, html, new UTF8Encoding(false));
            string script = Path.Combine(Cli.CliRunner.RepositoryRoot(), "tests", "report-browser-check.sh");
            var start = new ProcessStartInfo("bash", [script, page, folder, $"{widthPixels}x{heightPixels}"])
            {
                RedirectStandardOutput = true,
                RedirectStandardError = true,
                UseShellExecute = false,
            };
            start.Environment["CABLEFAULT_CHROMIUM"] = BrowserPath;
            using var process = Process.Start(start) ?? throw new InvalidOperationException("could not start bash");
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(Timeout))
            {
                process.Kill(entireProcessTree: true);
                throw new TimeoutException($"the browser check did not finish within {Timeout.TotalMinutes} minutes");
            }
            process.WaitForExit();
            if (process.ExitCode != 0)
                throw new InvalidOperationException($"report-browser-check.sh exited with {process.ExitCode}: {stderr.Result} {stdout.Result}");
            return new Rendering(File.ReadAllBytes(Path.Combine(folder, "report.pdf")), File.ReadAllBytes(Path.Combine(folder, "report.png")), folder);
        }
        finally
        {
            if (keep.Length == 0) Directory.Delete(folder, recursive: true);
        }
    }

    /// <summary>
    /// Pages in a PDF: the count of page objects (<c>/Type /Page</c>, not <c>/Pages</c>), and the /Count of the page
    /// tree root, read from the raw bytes (ISO 32000-1:2008, 7.7.3.2 and 7.7.3.3). Chromium writes these dictionaries
    /// uncompressed; object streams would hide them, and then the count is zero and the test says so.
    /// </summary>
    internal static (int PageObjects, int? TreeCount) CountPdfPages(byte[] pdf)
    {
        string text = Encoding.Latin1.GetString(pdf);
        int objects = PageObject().Matches(text).Count;
        var counts = PageTreeCount().Matches(text).Select(m => int.Parse(m.Groups[1].Success ? m.Groups[1].Value : m.Groups[2].Value)).ToList();
        return (objects, counts.Count > 0 ? counts.Max() : null);
    }

    /// <summary>Width and height of every /MediaBox in the PDF, points (ISO 32000-1:2008, 7.7.3.3, table 30).</summary>
    internal static List<(double Width, double Height)> MediaBoxes(byte[] pdf) =>
        MediaBox().Matches(Encoding.Latin1.GetString(pdf)).Select(m =>
        {
            double[] v = Enumerable.Range(1, 4).Select(i => double.Parse(m.Groups[i].Value, System.Globalization.CultureInfo.InvariantCulture)).ToArray();
            return (v[2] - v[0], v[3] - v[1]);
        }).ToList();

    /// <summary>Mean and standard deviation of the luminance (0…255, ITU-R BT.601 weights) and the share of pixels
    /// that differ from the most common colour (the page background) by more than a faint anti-aliasing edge.</summary>
    internal static (double Mean, double StandardDeviation, double InkFraction, int Width, int Height) Pixels(byte[] png)
    {
        using var bitmap = SKBitmap.Decode(png) ?? throw new InvalidOperationException("the screenshot is not a readable PNG");
        var histogram = new Dictionary<uint, int>();
        double sum = 0, sumSquares = 0;
        var pixels = bitmap.Pixels;
        foreach (var p in pixels)
        {
            double y = 0.299 * p.Red + 0.587 * p.Green + 0.114 * p.Blue;
            sum += y;
            sumSquares += y * y;
            uint key = (uint)p;
            histogram[key] = histogram.GetValueOrDefault(key) + 1;
        }
        var background = (SKColor)histogram.MaxBy(kv => kv.Value).Key;
        const int faint = 24;
        int ink = pixels.Count(p => Math.Abs(p.Red - background.Red) + Math.Abs(p.Green - background.Green) + Math.Abs(p.Blue - background.Blue) > faint);
        double mean = sum / pixels.Length;
        return (mean, Math.Sqrt(Math.Max(0, sumSquares / pixels.Length - mean * mean)), (double)ink / pixels.Length, bitmap.Width, bitmap.Height);
    }

    private static string? FindOnPath(string name)
    {
        foreach (string dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            string candidate = Path.Combine(dir, name);
            if (File.Exists(candidate)) return candidate;
        }
        return null;
    }

    [GeneratedRegex(@"/MediaBox\s*\[\s*(-?[\d.]+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s*\]")]
    private static partial Regex MediaBox();

    [GeneratedRegex(@"/Type\s*/Page(?![A-Za-z])")]
    private static partial Regex PageObject();

    [GeneratedRegex(@"/Type\s*/Pages\b[^>]*?/Count\s+(\d+)|/Count\s+(\d+)[^>]*?/Type\s*/Pages\b")]
    private static partial Regex PageTreeCount();
}
