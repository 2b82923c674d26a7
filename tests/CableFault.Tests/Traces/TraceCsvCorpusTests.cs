using CableFault.Traces;

namespace CableFault.Tests.Traces;

/// <summary>
/// Every file in Corpus/csv is a bad trace CSV. Each must be refused with an <see cref="InputException"/> whose one-line
/// message names the file, the line (where there is one) and the problem. The expectations were written from the
/// file contents by hand (line numbers counted in the files), not copied from the reader's output.
/// </summary>
public class TraceCsvCorpusTests
{
    private static readonly string CorpusFolder = Path.Combine(AppContext.BaseDirectory, "Corpus", "csv");

    public static TheoryData<string, string?, string> Cases => new()
    {
        // file, expected "line N" (null: whole-file problem), expected fragment naming the problem
        { "empty.csv", null, "empty" },
        { "only-comments.csv", null, "no rows of numbers" },
        { "header-only.csv", null, "no rows of numbers" },
        { "one-column.csv", "line 2", "only one column" },
        { "nan-value.csv", "line 4", "not a finite number" },
        { "infinity-value.csv", "line 4", "not a finite number" },
        { "decreasing-time.csv", "line 5", "earlier than" },
        { "duplicate-time.csv", "line 5", "repeats line 4" },
        { "gap.csv", "line 6", "a gap" },
        { "irregular-step.csv", "line 5", "an irregular step" },
        { "huge-voltage.csv", "line 4", "value 3.5E+07 in column 'volts' is beyond ±1e6" },
        { "time-unit-mixup.csv", "line 6", "beyond ±1 s" },
        { "single-sample.csv", null, "only 1 sample" },
        { "not-a-number.csv", "line 4", "'overrange' in column 'volts' is not a number" },
        { "truncated-middle.csv", "line 4", "only 1 of 2 columns, and more data follows" },
        { "mixed-decimal-marks.csv", "line 4", "line 2 uses ','" },
        { "decimal-comma-with-comma-delimiter.csv", "line 2", "decimal commas" },
        { "digit-grouping.csv", "line 3", "both '.' and ','" },
        { "no-header-three-columns.csv", "line 1", "3 columns and no header" },
        { "unknown-time-unit.csv", "line 1", "unit 'min', which is not understood" },
        { "two-time-columns.csv", "line 1", "two time columns" },
        { "no-voltage-column.csv", "line 1", "names no voltage column" },
        { "metadata-vf-decimal-comma.csv", "line 2", "metadata vf='0,66'" },
        { "metadata-z0-negative.csv", "line 1", "metadata z0='-50' is not a positive number" },
        { "utf16-no-bom.csv", "line 1", "NUL" },
        { "binary-garbage.csv", "line 3", "NUL" },
        { "bom-crlf-bad-value.csv", "line 4", "'0.1x' in column 'volts' is not a number" },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Bad_file_is_refused_with_a_one_line_message_naming_line_and_problem(string file, string? line, string problem)
    {
        using var stream = File.OpenRead(Path.Combine(CorpusFolder, file));

        var ex = Assert.Throws<InputException>(() => TraceCsvReader.Read(stream, file));

        Assert.StartsWith(file + ": ", ex.Message);
        if (line is not null) Assert.StartsWith($"{file}: {line}: ", ex.Message);
        else Assert.DoesNotContain(": line ", ex.Message);
        Assert.Contains(problem, ex.Message);
        Assert.DoesNotContain('\n', ex.Message);
        Assert.Contains(';', ex.Message); // "what is wrong; what to do"
    }

    [Fact]
    public void Every_corpus_file_has_a_case()
    {
        var covered = Cases.Select(row => (string)row[0]).ToHashSet();
        var present = Directory.GetFiles(CorpusFolder).Select(Path.GetFileName).ToHashSet();
        Assert.Equal(present.Order(), covered.Order());
    }
}
