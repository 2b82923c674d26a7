using System.Globalization;
using System.Numerics;

namespace CableFault.FrequencyDomain;

/// <summary>
/// Writes reflection data as a one-port Touchstone file (<c>.s1p</c>), version 1.x or 2.0, frequencies in Hz.
/// Numbers are written in round-trip form, so RI data read back bit for bit; MA and DB differ only by the rounding
/// of the polar conversion (a few ulps).
/// </summary>
public static class TouchstoneWriter
{
    /// <summary>Writes <paramref name="data"/> to <paramref name="writer"/>.</summary>
    /// <param name="data">The reflection data.</param>
    /// <param name="writer">Destination text.</param>
    /// <param name="format">Number format of the data lines.</param>
    /// <param name="version">1.x (option line and data) or 2.0 (with keywords).</param>
    public static void Write(ReflectionData data, TextWriter writer, TouchstoneDataFormat format = TouchstoneDataFormat.RealImaginary,
        TouchstoneVersion version = TouchstoneVersion.V1)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(writer);
        var inv = CultureInfo.InvariantCulture;
        writer.NewLine = "\n";
        if (version == TouchstoneVersion.V2) writer.WriteLine("[Version] 2.0");
        foreach (var comment in data.Comments)
            foreach (var line in comment.Split('\n'))
                writer.WriteLine("! " + line.TrimEnd('\r'));
        string formatName = format switch
        {
            TouchstoneDataFormat.RealImaginary => "RI",
            TouchstoneDataFormat.MagnitudeAngle => "MA",
            _ => "DB",
        };
        writer.WriteLine($"# Hz S {formatName} R {data.ReferenceImpedanceOhms.ToString("R", inv)}");
        if (version == TouchstoneVersion.V2)
        {
            writer.WriteLine("[Number of Ports] 1");
            writer.WriteLine($"[Number of Frequencies] {data.Count.ToString(inv)}");
            writer.WriteLine("[Network Data]");
        }
        for (int i = 0; i < data.Count; i++)
        {
            var (a, b) = Split(data.ReflectionCoefficients[i], format);
            writer.WriteLine($"{data.FrequenciesHz[i].ToString("R", inv)} {a.ToString("R", inv)} {b.ToString("R", inv)}");
        }
        if (version == TouchstoneVersion.V2) writer.WriteLine("[End]");
    }

    private static (double A, double B) Split(Complex value, TouchstoneDataFormat format) => format switch
    {
        TouchstoneDataFormat.RealImaginary => (value.Real, value.Imaginary),
        TouchstoneDataFormat.MagnitudeAngle => (value.Magnitude, value.Phase * 180 / Math.PI),
        // A zero magnitude has no finite decibel value; −400 dB (10^−20) is far below any measurement.
        _ => (value.Magnitude > 0 ? Math.Max(20 * Math.Log10(value.Magnitude), -400) : -400, value.Phase * 180 / Math.PI),
    };
}
