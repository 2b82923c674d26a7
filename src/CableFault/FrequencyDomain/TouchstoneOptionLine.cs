using System.Globalization;

namespace CableFault.FrequencyDomain;

/// <summary>
/// The option line <c># &lt;frequency unit&gt; &lt;parameter&gt; &lt;format&gt; R &lt;n&gt;</c>. Fields may come in any order and be
/// left out; a missing field takes the Touchstone default: GHz, S, MA, R 50 (Touchstone File Format Specification,
/// IBIS Open Forum, version 1.1 and 2.0, "Option Line"; from memory). Case is ignored.
/// </summary>
internal sealed record TouchstoneOptionLine(string FrequencyUnit, double FrequencyScale, NetworkParameterKind Parameter,
    TouchstoneDataFormat Format, double ReferenceOhms)
{
    internal static TouchstoneOptionLine Defaults => new("GHz", 1e9, NetworkParameterKind.S, TouchstoneDataFormat.MagnitudeAngle, 50);

    /// <summary>Parses the text after <c>#</c>. Throws <see cref="InputException"/> naming the line on an unknown field.</summary>
    internal static TouchstoneOptionLine Parse(string text, string sourceName, int lineNumber)
    {
        var result = Defaults;
        var tokens = text.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
        for (int i = 0; i < tokens.Length; i++)
        {
            string token = tokens[i].ToUpperInvariant();
            switch (token)
            {
                case "HZ": result = result with { FrequencyUnit = "Hz", FrequencyScale = 1 }; break;
                case "KHZ": result = result with { FrequencyUnit = "kHz", FrequencyScale = 1e3 }; break;
                case "MHZ": result = result with { FrequencyUnit = "MHz", FrequencyScale = 1e6 }; break;
                case "GHZ": result = result with { FrequencyUnit = "GHz", FrequencyScale = 1e9 }; break;
                case "S": result = result with { Parameter = NetworkParameterKind.S }; break;
                case "Y": result = result with { Parameter = NetworkParameterKind.Y }; break;
                case "Z": result = result with { Parameter = NetworkParameterKind.Z }; break;
                case "H": result = result with { Parameter = NetworkParameterKind.H }; break;
                case "G": result = result with { Parameter = NetworkParameterKind.G }; break;
                case "RI": result = result with { Format = TouchstoneDataFormat.RealImaginary }; break;
                case "MA": result = result with { Format = TouchstoneDataFormat.MagnitudeAngle }; break;
                case "DB": result = result with { Format = TouchstoneDataFormat.DecibelAngle }; break;
                case "R":
                    if (i + 1 >= tokens.Length || !double.TryParse(tokens[i + 1], NumberStyles.Float, CultureInfo.InvariantCulture, out double r)
                        || !(r > 0) || !double.IsFinite(r))
                        throw new InputException(
                            $"{sourceName}, line {lineNumber}: the option line's R must be followed by a positive reference resistance in ohms; write e.g. '# GHz S MA R 50'.");
                    result = result with { ReferenceOhms = r };
                    i++;
                    break;
                default:
                    throw new InputException(
                        $"{sourceName}, line {lineNumber}: option line field '{tokens[i]}' is not a Touchstone unit (Hz kHz MHz GHz), parameter (S Y Z H G), format (RI MA DB) or 'R <ohms>'; correct it.");
            }
        }
        return result;
    }
}
