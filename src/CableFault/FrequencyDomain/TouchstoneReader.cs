using System.Globalization;
using System.Numerics;

namespace CableFault.FrequencyDomain;

/// <summary>
/// Reads one-port reflection data (S11) from a Touchstone file: a one-port file, or the S11 column of a two-port file.
/// Versions 1.x and 2.0 of the Touchstone File Format Specification (IBIS Open Forum) are accepted.
/// </summary>
/// <remarks>
/// <para>Choices where the format leaves room, so that a user can predict what happens:</para>
/// <list type="bullet">
/// <item>The option line is required in both versions (the specification asks for one in every file). A 1.x file
/// without it is refused rather than read with the defaults, because a file in Hz read as GHz would put every echo
/// 10⁹ times too close without any other sign of trouble. Fields left out of the option line take the defaults
/// GHz, S, MA, R 50. In 1.x a second option line is ignored with a warning; in 2.0 it is an error.</item>
/// <item>Version 1.x files carry no port count: it comes from the source name's extension (<c>.s1p</c>, <c>.s2p</c>),
/// or, failing that, from the number of values on the first data line (3 → one port, 9 → two ports).</item>
/// <item>A data record (frequency plus its complex values) may continue over several lines; one line may not hold
/// the end of one record and the start of the next.</item>
/// <item>In a 1.x two-port file the columns are S11 S21 S12 S22; noise parameters follow the network data and are
/// recognised by a frequency that does not increase on a five-value line, and are skipped.</item>
/// <item>Y and Z data of a one-port are converted to S11: in 1.x they are normalised to R
/// (Γ = (z − 1)/(z + 1), Γ = (1 − y)/(1 + y)); in 2.0 they are in ohms and siemens (from memory of the 2.0 text).
/// H and G parameters, and non-S two-port data, are refused.</item>
/// </list>
/// </remarks>
public static class TouchstoneReader
{
    /// <summary>Default size limit, characters (64 Mi): about two million one-port points, far beyond any sweep.</summary>
    public const long DefaultMaximumCharacters = 64L * 1024 * 1024;

    /// <summary>Highest frequency accepted, Hz (10 THz): far above any network analyser, so a larger value is a unit slip
    /// or a corrupt number, and it keeps the arithmetic of the transform finite.</summary>
    public const double MaximumFrequencyHz = 1e13;

    /// <summary>Largest |S11| accepted: 10. A passive one-port has |S11| ≤ 1; calibration error can push a point a little
    /// above, while a value of 10 or more means a wrong format (dB read as magnitude) or a corrupt number.</summary>
    public const double MaximumReflectionMagnitude = 10;

    /// <summary>Reads S11. Throws <see cref="InputException"/> (one line: source, line, problem, remedy) on malformed input.</summary>
    /// <param name="reader">The file's text.</param>
    /// <param name="sourceName">The name used in messages; its extension (<c>.s1p</c>/<c>.s2p</c>) gives a 1.x file's port count.</param>
    /// <param name="maximumCharacters">Refuse files longer than this many characters.</param>
    public static ReflectionData Read(TextReader reader, string sourceName, long maximumCharacters = DefaultMaximumCharacters)
    {
        ArgumentNullException.ThrowIfNull(reader);
        return new Parser(new TouchstoneLineSource(reader, sourceName, maximumCharacters), sourceName).Run();
    }

    private enum Section { Header, NetworkData, NoiseData, Information, Ended }

    private sealed class Parser(TouchstoneLineSource lines, string sourceName)
    {
        private readonly List<string> _comments = [];
        private readonly List<string> _warnings = [];
        private readonly List<double> _frequencies = [];
        private readonly List<Complex> _values = [];
        private readonly List<double> _record = [];
        private TouchstoneVersion _version = TouchstoneVersion.V1;
        private TouchstoneOptionLine? _options;
        private int _ports = PortsFromName(sourceName);
        private int? _declaredFrequencyCount;
        private string? _twoPortOrder;
        private string _matrixFormat = "FULL";
        private readonly List<double> _references = [];
        private bool _collectingReferences;
        private bool _sawContent;
        private bool _sawEnd;
        private int _recordStartLine;
        private Section _section = Section.Header;

        internal ReflectionData Run()
        {
            string? raw;
            while (_section != Section.Ended && (raw = lines.ReadLine()) is not null)
            {
                if (raw.Contains('\0'))
                    throw Error("the line holds NUL characters, so this is binary data or UTF-16 text without a byte-order mark; save the file as plain text (UTF-8 or ASCII).");
                string content = StripComment(raw).Trim();
                if (content.Length == 0) continue;
                if (content[0] == '[') Keyword(content);
                else if (content[0] == '#') Option(content[1..]);
                else Data(content);
                _sawContent = true;
            }
            return Finish();
        }

        private string Where => $"{sourceName}, line {lines.LineNumber}";

        private InputException Error(string problemAndRemedy) => new($"{Where}: {problemAndRemedy}");

        private string StripComment(string line)
        {
            int bang = line.IndexOf('!');
            if (bang < 0) return line;
            string comment = line[(bang + 1)..].Trim();
            if (comment.Length > 0) _comments.Add(comment);
            return line[..bang];
        }

        private static int PortsFromName(string name)
        {
            string ext = Path.GetExtension(name ?? "").ToLowerInvariant();
            if (ext.Length >= 4 && ext[1] == 's' && ext[^1] == 'p' && int.TryParse(ext[2..^1], out int n) && n > 0) return n;
            return 0;
        }

        private void Keyword(string content)
        {
            int close = content.IndexOf(']');
            if (close < 0) throw Error($"'{content}' opens a keyword with '[' but has no ']'; write keywords as [Name] value.");
            string name = string.Join(' ', content[1..close].Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries)).ToUpperInvariant();
            string argument = content[(close + 1)..].Trim();
            _collectingReferences = false;

            if (_section == Section.Information)
            {
                if (name == "END INFORMATION") _section = Section.Header;
                return;
            }
            if (name == "VERSION")
            {
                if (_sawContent) throw Error("[Version] must be the first keyword or option in the file; move it to the top.");
                if (!argument.StartsWith("2.", StringComparison.Ordinal))
                    throw Error($"[Version] {argument} is not supported; this reader accepts 2.0 (and 1.x files, which have no [Version]).");
                if (argument != "2.0") _warnings.Add($"{sourceName}: [Version] {argument} is read as 2.0; features added later are not understood.");
                _version = TouchstoneVersion.V2;
                _ports = 0; // 2.0 declares the port count itself.
                return;
            }
            if (_version == TouchstoneVersion.V1)
                throw Error($"keyword [{content[1..close].Trim()}] belongs to Touchstone 2.0; add '[Version] 2.0' as the first line or remove the keyword.");

            switch (name)
            {
                case "NUMBER OF PORTS":
                    _ports = ParsePositiveInteger(argument, "[Number of Ports]");
                    if (_ports > 2) throw Error($"[Number of Ports] {_ports}: only one- and two-port files can be read for reflection; export S11 as a one-port file.");
                    break;
                case "TWO-PORT DATA ORDER":
                    string order = argument.ToUpperInvariant();
                    if (order is not ("12_21" or "21_12")) throw Error($"[Two-Port Data Order] must be 12_21 or 21_12, found '{argument}'; correct it.");
                    _twoPortOrder = order;
                    break;
                case "NUMBER OF FREQUENCIES":
                    _declaredFrequencyCount = ParsePositiveInteger(argument, "[Number of Frequencies]");
                    break;
                case "NUMBER OF NOISE FREQUENCIES":
                    break;
                case "REFERENCE":
                    _references.Clear();
                    _collectingReferences = true;
                    AddReferences(argument);
                    break;
                case "MATRIX FORMAT":
                    string format = argument.ToUpperInvariant();
                    if (format is not ("FULL" or "LOWER" or "UPPER")) throw Error($"[Matrix Format] must be Full, Lower or Upper, found '{argument}'; correct it.");
                    _matrixFormat = format;
                    break;
                case "MIXED-MODE ORDER":
                    throw Error("mixed-mode data cannot be read as a single-ended reflection; export single-ended S11.");
                case "BEGIN INFORMATION":
                    _section = Section.Information;
                    break;
                case "NETWORK DATA":
                    StartNetworkData();
                    break;
                case "NOISE DATA":
                    _section = Section.NoiseData;
                    break;
                case "END":
                    _sawEnd = true;
                    _section = Section.Ended;
                    break;
                default:
                    _warnings.Add($"{Where}: keyword [{content[1..close].Trim()}] is not used by this reader and was skipped.");
                    break;
            }
        }

        private int ParsePositiveInteger(string text, string keyword)
        {
            if (!int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int n) || n < 1)
                throw Error($"{keyword} needs a whole number ≥ 1, found '{text}'; correct it.");
            return n;
        }

        private void AddReferences(string text)
        {
            foreach (var token in text.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries))
            {
                if (!double.TryParse(token, NumberStyles.Float, CultureInfo.InvariantCulture, out double r) || !(r > 0) || !double.IsFinite(r))
                    throw Error($"[Reference] value '{token}' is not a positive resistance in ohms; correct it.");
                _references.Add(r);
            }
        }

        private void StartNetworkData()
        {
            if (_options is null) throw Error("[Network Data] comes before the option line; a 2.0 file needs '# <unit> <parameter> <format> R <ohms>' after [Version].");
            if (_ports == 0) throw Error("[Network Data] comes before [Number of Ports]; declare the port count first.");
            if (_declaredFrequencyCount is null) throw Error("[Network Data] comes before [Number of Frequencies], which 2.0 files require; add it.");
            if (_ports == 2 && _twoPortOrder is null) throw Error("a two-port 2.0 file needs [Two-Port Data Order] 12_21 or 21_12 before [Network Data]; add it.");
            if (_references.Count != 0 && _references.Count != _ports)
                throw Error($"[Reference] lists {_references.Count} values for {_ports} ports; give one reference resistance per port.");
            _section = Section.NetworkData;
        }

        private void Option(string text)
        {
            if (_frequencies.Count > 0 || _record.Count > 0)
                throw Error("the option line comes after network data; move it above the first data line.");
            if (_options is not null)
            {
                if (_version == TouchstoneVersion.V2) throw Error("a second option line; a 2.0 file has exactly one, so delete the extra line.");
                _warnings.Add($"{Where}: a second option line was ignored (only the first one counts).");
                return;
            }
            _options = TouchstoneOptionLine.Parse(text, sourceName, lines.LineNumber);
        }

        private void Data(string content)
        {
            if (_collectingReferences && _section == Section.Header)
            {
                AddReferences(content);
                return;
            }
            if (_section is Section.NoiseData or Section.Information) return;
            if (_version == TouchstoneVersion.V2 && _section != Section.NetworkData)
                throw Error("numbers before [Network Data]; put the data after the [Network Data] keyword.");
            if (_options is null)
                throw Error("data before any option line; add '# <unit> <parameter> <format> R <ohms>' (e.g. '# GHz S MA R 50') above the data.");

            var tokens = content.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
            var values = new double[tokens.Length];
            for (int i = 0; i < tokens.Length; i++)
                if (!double.TryParse(tokens[i], NumberStyles.Float, CultureInfo.InvariantCulture, out values[i]) || !double.IsFinite(values[i]))
                    throw Error($"'{tokens[i]}' is not a number; data lines hold only numbers (comments start with '!').");

            if (_ports == 0) _ports = InferPorts(values.Length);
            if (_ports > 2) throw Error($"the file has {_ports} ports; only one- and two-port files can be read for reflection, so export S11 as a one-port file.");

            int expected = ValuesPerRecord();
            if (_record.Count == 0)
            {
                // 1.x two-port files may end with noise parameters: five values and a frequency that starts again.
                if (_version == TouchstoneVersion.V1 && _ports == 2 && values.Length == 5 && _frequencies.Count > 0
                    && values[0] * _options.FrequencyScale <= _frequencies[^1])
                {
                    _section = Section.NoiseData;
                    return;
                }
                _recordStartLine = lines.LineNumber;
            }
            _record.AddRange(values);
            if (_record.Count > expected)
            {
                string started = _recordStartLine == lines.LineNumber ? "" : $" (the record started on line {_recordStartLine})";
                throw Error($"a data record has {_record.Count} values{started} where a {_ports}-port record needs {expected} " +
                            $"(frequency and {(expected - 1) / 2} complex values); fix the columns of this line.");
            }
            if (_record.Count == expected) FinishRecord();
        }

        private int InferPorts(int valueCount) => valueCount switch
        {
            3 => 1,
            9 => 2,
            _ => throw Error($"cannot tell the number of ports from the first data line ({valueCount} values); name the file .s1p or .s2p, or use a 2.0 file with [Number of Ports]."),
        };

        private int ValuesPerRecord()
        {
            int entries = _matrixFormat == "FULL" ? _ports * _ports : _ports * (_ports + 1) / 2;
            return 1 + 2 * entries;
        }

        private void FinishRecord()
        {
            var options = _options!;
            double frequencyHz = _record[0] * options.FrequencyScale;
            if (!double.IsFinite(frequencyHz) || frequencyHz > MaximumFrequencyHz)
                throw Error($"frequency {_record[0]} {options.FrequencyUnit} is beyond {MaximumFrequencyHz:G3} Hz; check the option line's unit and the number.");
            if (frequencyHz < 0) throw Error($"frequency {_record[0]} {options.FrequencyUnit} is negative; frequencies must be ≥ 0.");
            if (_frequencies.Count > 0 && !(frequencyHz > _frequencies[^1]))
                throw Error($"frequency {_record[0]} {options.FrequencyUnit} is not above the previous one ({_frequencies[^1] / options.FrequencyScale} {options.FrequencyUnit}); frequencies must increase, so sort or remove the repeated point.");
            // S11 comes first in every layout: 1.x (S11 S21 S12 S22), 2.0 with either data order, full or triangular.
            var value = ToComplex(_record[1], _record[2], options.Format);
            if (options.Parameter == NetworkParameterKind.S && !(value.Magnitude <= MaximumReflectionMagnitude))
                throw Error($"|S11| = {value.Magnitude:G3} at {_record[0]} {options.FrequencyUnit}; a cable run reflects at most about 1, so check the format (RI, MA or DB) on the option line and the number.");
            _frequencies.Add(frequencyHz);
            _values.Add(value);
            _record.Clear();
        }

        private static Complex ToComplex(double a, double b, TouchstoneDataFormat format) => format switch
        {
            TouchstoneDataFormat.RealImaginary => new Complex(a, b),
            TouchstoneDataFormat.MagnitudeAngle => Complex.FromPolarCoordinates(a, b * Math.PI / 180),
            _ => Complex.FromPolarCoordinates(Math.Pow(10, a / 20), b * Math.PI / 180),
        };

        private ReflectionData Finish()
        {
            if (_record.Count > 0)
                throw new InputException($"{sourceName}, line {_recordStartLine}: the last data record is incomplete ({_record.Count} of {ValuesPerRecord()} values); complete or delete it.");
            if (_options is null)
                throw new InputException($"{sourceName}: no option line; add '# <unit> <parameter> <format> R <ohms>' (e.g. '# GHz S MA R 50') before the data.");
            if (_frequencies.Count == 0)
                throw new InputException($"{sourceName}: no network data found; check that the file holds frequency lines after the option line{(_version == TouchstoneVersion.V2 ? " and [Network Data]" : "")}.");
            if (_version == TouchstoneVersion.V2)
            {
                if (_declaredFrequencyCount != _frequencies.Count)
                    throw new InputException($"{sourceName}: [Number of Frequencies] says {_declaredFrequencyCount} but {_frequencies.Count} were read; correct the count or the data.");
                if (!_sawEnd) _warnings.Add($"{sourceName}: no [End] keyword; the file may be cut short.");
            }

            double reference = _references.Count > 0 ? _references[0] : _options.ReferenceOhms;
            var gamma = ConvertToReflection(_values, _options.Parameter, reference);
            var info = new TouchstoneFileInfo(_version, _ports, _options.Parameter, _options.Format, _options.FrequencyUnit, _options.FrequencyScale);
            return new ReflectionData(_frequencies, gamma, reference, _comments, info, _warnings);
        }

        private List<Complex> ConvertToReflection(List<Complex> values, NetworkParameterKind parameter, double referenceOhms)
        {
            if (parameter == NetworkParameterKind.S) return values;
            if (parameter is NetworkParameterKind.H or NetworkParameterKind.G || _ports != 1)
                throw new InputException($"{sourceName}: {parameter} parameters of a {_ports}-port cannot be turned into a reflection here; export S parameters.");
            // 1.x Z and Y values are normalised to R; 2.0 values are in ohms and siemens.
            bool normalised = _version == TouchstoneVersion.V1;
            _warnings.Add($"{sourceName}: {parameter} parameters were converted to S11 referred to {referenceOhms} Ω.");
            return values.Select(v =>
            {
                if (parameter == NetworkParameterKind.Z)
                {
                    Complex z = normalised ? v : v / referenceOhms;
                    return (z - 1) / (z + 1);
                }
                Complex y = normalised ? v : v * referenceOhms;
                return (1 - y) / (1 + y);
            }).ToList();
        }
    }
}
