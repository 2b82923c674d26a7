namespace CableFault.Traces.Csv;

/// <summary>
/// How finely a file's sample times are printed: the place value of each time's last digit. An instrument samples on a
/// uniform grid, but an export that prints time to seven significant digits ("1.234567e-06") rounds a 37.5 ps step near
/// 1 µs to the picosecond, 2.7 % of the step: the printed steps then wander by more than the jitter allowance while
/// the samples themselves are on the grid. <see cref="UniformGrid"/> allows each time its rounding.
/// </summary>
/// <remarks>
/// One style per file is assumed for the digit counts, two per file for the notation (C's %g prints small and large
/// times differently). Fixed formats ("%.6e", "%.3f") keep trailing zeros, so every time shows the file's digits; short
/// formats (shortest round-trip, %g) drop them, so a time that prints short is exact at the file's finer place. Hence
/// the file's largest count is taken for every time: significant digits in exponent notation, and for plain decimals the
/// coarser of what the largest significant-digit count and the largest count of decimals allow.
/// </remarks>
internal sealed class TimePrecision
{
    private readonly double _divisor;
    private readonly List<bool> _exponentNotation = [];
    private int _exponentSignificant;
    private int _plainSignificant;
    private int _plainDecimals;

    /// <param name="divisor">The time column's divisor to seconds (<see cref="CsvColumn.Divisor"/>).</param>
    internal TimePrecision(double divisor) => _divisor = divisor;

    /// <summary>How a time was printed: in exponent notation or not, its significant digits, and its decimals (after the
    /// mark; plain notation only).</summary>
    internal readonly record struct Printed(bool Exponent, int Significant, int Decimals);

    /// <summary>How <paramref name="field"/>, a printed time, was printed.</summary>
    internal static Printed Measure(ReadOnlySpan<char> field)
    {
        field = field.Trim().TrimStart("+-");
        int e = field.IndexOfAny('e', 'E');
        var mantissa = e < 0 ? field : field[..e];
        int mark = mantissa.IndexOfAny('.', ',');
        int significant = 0;
        foreach (char c in mantissa)
            if (char.IsAsciiDigit(c) && (significant > 0 || c != '0')) significant++;
        return new Printed(e >= 0, significant, e >= 0 || mark < 0 ? 0 : mantissa.Length - mark - 1);
    }

    /// <summary>Notes how the time of the next accepted sample was printed (<see cref="Measure"/>).</summary>
    internal void Note(Printed printed)
    {
        _exponentNotation.Add(printed.Exponent);
        if (printed.Exponent)
        {
            _exponentSignificant = Math.Max(_exponentSignificant, printed.Significant);
            return;
        }
        _plainSignificant = Math.Max(_plainSignificant, printed.Significant);
        _plainDecimals = Math.Max(_plainDecimals, printed.Decimals);
    }

    /// <summary>The place value of the last printed digit of sample <paramref name="index"/>'s time
    /// <paramref name="timeSeconds"/>, s: the time is exact to half of it. Zero for a time of zero, which a short format
    /// prints as "0" however fine its other times are.</summary>
    internal double QuantumSeconds(int index, double timeSeconds)
    {
        double printed = Math.Abs(timeSeconds * _divisor);
        if (printed == 0) return 0;
        double magnitude = Math.Floor(Math.Log10(printed));
        double bySignificant(int digits) => digits > 0 ? Math.Pow(10, magnitude - (digits - 1)) : 0;
        double quantum = _exponentNotation[index]
            ? bySignificant(_exponentSignificant)
            : Math.Max(bySignificant(_plainSignificant), Math.Pow(10, -_plainDecimals));
        return quantum / _divisor;
    }
}
