namespace CableFault.Traces.Csv;

/// <summary>
/// One pass over a trace CSV: comments and metadata anywhere, then preamble lines, an optional header and the data
/// rows. Everything is checked as it streams by (data rows a batch of a few thousand at a time), so a bad file fails at
/// its first bad line and a huge one at the limit, not after it has been read whole. See <see cref="TraceCsvReader"/>
/// for the accepted format.
/// </summary>
internal sealed class TraceCsvParser
{
    private readonly string _source;
    private readonly TraceCsvLimits _limits;
    private readonly List<string> _warnings = [];
    private readonly TraceCsvMetadata _metadata;

    private bool _anyContent;
    private string? _headerCandidate;
    private int _headerCandidateLine;
    private int _firstSingleColumnLine;

    private CsvNumberFormat? _format;
    private CsvColumn _timeColumn;
    private CsvColumn _signalColumn;
    private int _timeIndex;
    private int _signalIndex;
    private int _expectedFields;
    private int _requiredFields;
    private bool _hasHeader;

    private readonly List<double> _times = [];
    private readonly List<double> _values = [];
    private readonly List<int> _lines = [];
    private TimePrecision? _timePrecision;
    private int _truncatedLine;
    private int _truncatedFieldCount;

    public TraceCsvParser(string sourceName, TraceCsvLimits limits)
    {
        _source = sourceName;
        _limits = limits;
        _metadata = new TraceCsvMetadata(sourceName, _warnings);
    }

    public TraceReadResult Parse(TextReader reader)
    {
        var lines = new CsvLineSource(reader, _source, _limits.MaxInputBytes, _limits.MaxLineChars);
        var batch = new DataLineBatch();
        while (NextLine(lines, batch, out string raw))
        {
            int ln = lines.LineNumber;
            if (raw.Contains('\0'))
            {
                // The lines before it are read first, so that the first bad line is the one reported.
                ReadBatch(batch);
                throw new InputException(
                    $"{_source}: line {ln}: contains NUL characters, so it is binary or UTF-16 without a byte-order mark; save it as UTF-8 text.");
            }
            string line = raw.Trim();
            if (line.Length == 0) continue;
            _anyContent = true;
            if (_format is not null && line[0] != '#')
            {
                batch.Add(line, ln);
                if (batch.IsFull) ReadBatch(batch);
                continue;
            }
            ReadBatch(batch);
            if (line[0] == '#') _metadata.ReadComment(line, ln);
            else ReadBeforeData(line, ln);
        }
        ReadBatch(batch);
        return Finish();
    }

    /// <summary>The next line; when the input is refused (too large, a line too long), the rows before it are read
    /// first, so that a bad row among them is still the error reported.</summary>
    private bool NextLine(CsvLineSource lines, DataLineBatch batch, out string line)
    {
        try
        {
            return lines.TryReadLine(out line);
        }
        catch (InputException)
        {
            ReadBatch(batch);
            throw;
        }
    }

    /// <summary>
    /// Reads a batch of data rows in file order. The rows' numbers are parsed first, each row on its own (shared among the
    /// cores for a large batch: parsing is most of a long file's reading); then every row is checked and kept in order as
    /// <see cref="ReadDataLine"/> would, so a bad file fails at the same first bad line with the same message.
    /// </summary>
    private void ReadBatch(DataLineBatch batch)
    {
        if (batch.Count == 0) return;
        var rows = batch.Rows;
        if (_truncatedLine == 0)
        {
            void ParseRows(int from, int to)
            {
                for (int k = from; k < to; k++) rows[k].Plain = TryParsePlainRow(rows[k].Line, out rows[k].Values);
            }
            int ranges = batch.Count < ParallelMinimumRows ? 1
                : Math.Min(batch.Count / (ParallelMinimumRows / 2), 2 * Environment.ProcessorCount);
            Simulation.BinSplitting.ForRanges(batch.Count, ranges, ParseRows);
        }
        for (int k = 0; k < batch.Count; k++)
        {
            ref var row = ref rows[k];
            // A row after a short one is an error however it parsed (ReadDataLine reports it).
            if (_truncatedLine == 0 && row.Plain) Accept(row.Values.Time, row.Values.Value, row.LineNumber, row.Values.Printed);
            else ReadDataLine(row.Line, row.LineNumber);
        }
        batch.Clear();
    }

    /// <summary>Rows parsed side by side only from this many on (a few hundred microseconds of parsing).</summary>
    private const int ParallelMinimumRows = 2048;

    /// <summary>Data rows held until they are read together (see <see cref="ReadBatch"/>).</summary>
    private sealed class DataLineBatch
    {
        private const int Capacity = 8192;

        internal Row[] Rows { get; } = new Row[Capacity];

        internal int Count { get; private set; }

        internal bool IsFull => Count == Capacity;

        internal void Add(string line, int lineNumber) => Rows[Count++] = new Row { Line = line, LineNumber = lineNumber };

        internal void Clear()
        {
            Array.Clear(Rows, 0, Count);
            Count = 0;
        }
    }

    /// <summary>One data row: its text and line, and once parsed, whether it is a plain row and its values.</summary>
    private struct Row
    {
        internal string Line;
        internal int LineNumber;
        internal bool Plain;
        internal PlainValues Values;
    }

    private void ReadBeforeData(string line, int ln)
    {
        char? delimiter = CsvNumberFormat.DetectDelimiter(line);
        var fields = delimiter is { } d ? CsvNumberFormat.Split(line, d) : [line];
        bool numeric = fields.Count > 0 && fields.TrueForAll(CsvNumberFormat.LooksNumeric);
        if (numeric && fields.Count >= 2)
        {
            _format = new CsvNumberFormat(delimiter!.Value, _source);
            ResolveColumns(fields.Count, ln);
            ReadDataLine(line, ln);
        }
        else if (numeric)
        {
            if (_firstSingleColumnLine == 0) _firstSingleColumnLine = ln;
        }
        else
        {
            _headerCandidate = line;
            _headerCandidateLine = ln;
        }
    }

    private void ResolveColumns(int dataFieldCount, int firstDataLine)
    {
        if (_headerCandidate is not null)
        {
            var names = CsvNumberFormat.Split(_headerCandidate, _format!.Delimiter);
            var columns = names.ConvertAll(CsvHeaderParser.Parse);
            if (columns.Exists(c => c.Quantity != ColumnQuantity.Unknown || c.UnrecognisedUnit is not null))
            {
                UseHeader(columns);
                return;
            }
            _warnings.Add($"{_source}: line {_headerCandidateLine}: not a header (names no time or voltage column); read as preamble.");
        }

        if (dataFieldCount != 2)
            throw new InputException(
                $"{_source}: line {firstDataLine}: {dataFieldCount} columns and no header naming them; add a header row such as time_s,volts.");
        _timeColumn = new CsvColumn("column 1", ColumnQuantity.Time, 1, false);
        _signalColumn = new CsvColumn("column 2", ColumnQuantity.Voltage, 1, false);
        (_timeIndex, _signalIndex, _expectedFields, _requiredFields) = (0, 1, 2, 2);
        _warnings.Add($"{_source}: no header row; assumed column 1 is time in seconds and column 2 is voltage in volts (a header such as time_ns,mv states the units).");
    }

    private void UseHeader(List<CsvColumn> columns)
    {
        int hl = _headerCandidateLine;
        foreach (var c in columns)
            if (c.UnrecognisedUnit is { } unit)
                throw new InputException(
                    $"{_source}: line {hl}: column '{c.Header}' has unit '{unit}', which is not understood; use s, ms, us, ns or ps for time and V, mV or rho for the signal.");

        var timeIdx = Enumerable.Range(0, columns.Count).Where(i => columns[i].Quantity == ColumnQuantity.Time).ToList();
        var signalIdx = Enumerable.Range(0, columns.Count).Where(i => columns[i].IsSignal).ToList();
        if (timeIdx.Count > 1)
            throw new InputException(
                $"{_source}: line {hl}: two time columns ('{columns[timeIdx[0]].Header}' and '{columns[timeIdx[1]].Header}'); keep one.");

        if (timeIdx.Count == 0 || signalIdx.Count == 0)
        {
            string missing = timeIdx.Count == 0 ? "time" : "voltage";
            if (columns.Count != 2)
                throw new InputException(
                    $"{_source}: line {hl}: the header names no {missing} column; name it, e.g. time_s or volts.");
            int other = timeIdx.Count == 0 ? 1 - signalIdx[0] : 1 - timeIdx[0];
            var assumed = timeIdx.Count == 0
                ? new CsvColumn(columns[other].Header, ColumnQuantity.Time, 1, false)
                : new CsvColumn(columns[other].Header, ColumnQuantity.Voltage, 1, false);
            columns[other] = assumed;
            if (timeIdx.Count == 0) timeIdx.Add(other); else signalIdx.Add(other);
        }

        _timeIndex = timeIdx[0];
        _signalIndex = signalIdx[0];
        _timeColumn = columns[_timeIndex];
        _signalColumn = columns[_signalIndex];
        _expectedFields = columns.Count;
        _requiredFields = Math.Max(_timeIndex, _signalIndex) + 1;
        _hasHeader = true;

        if (!_timeColumn.UnitStated)
            _warnings.Add($"{_source}: line {hl}: column '{_timeColumn.Header}' states no unit; assumed seconds (name it time_s or time_ns).");
        if (!_signalColumn.UnitStated)
            _warnings.Add($"{_source}: line {hl}: column '{_signalColumn.Header}' states no unit; assumed volts (name it volts or mv).");
        if (signalIdx.Count > 1)
            _warnings.Add($"{_source}: line {hl}: several signal columns; used '{_signalColumn.Header}' and ignored the others.");
    }

    private void ReadDataLine(string line, int ln)
    {
        if (_truncatedLine == 0 && TryReadPlainDataLine(line, ln)) return;
        if (_truncatedLine != 0)
            throw new InputException(
                $"{_source}: line {_truncatedLine}: only {_truncatedFieldCount} of {_expectedFields} columns, and more data follows; fix or delete that line.");

        var fields = CsvNumberFormat.Split(line, _format!.Delimiter);
        if (fields.Count > _expectedFields)
        {
            string expected = _hasHeader ? $"the header has {_expectedFields}" : $"expected {_expectedFields}";
            string hint = _format.Delimiter == ','
                ? "if the numbers use decimal commas, separate columns with ';' or tab"
                : "make every row the same shape as the header";
            throw new InputException($"{_source}: line {ln}: {fields.Count} fields but {expected}; {hint}.");
        }
        if (fields.Count < _requiredFields)
        {
            // Only forgivable as the last line (an export cut short); the next data line turns it into an error.
            _truncatedLine = ln;
            _truncatedFieldCount = fields.Count;
            return;
        }

        Accept(Parse(fields[_timeIndex], _timeColumn, ln), Parse(fields[_signalIndex], _signalColumn, ln), ln,
            TimePrecision.Measure(fields[_timeIndex]));
    }

    /// <summary>The usual data row read without splitting it into strings (see <see cref="TryParsePlainRow"/>).</summary>
    private bool TryReadPlainDataLine(string line, int ln)
    {
        if (!TryParsePlainRow(line, out var values)) return false;
        Accept(values.Time, values.Value, ln, values.Printed);
        return true;
    }

    /// <summary>A plain row's time and value (in seconds and volts) and how finely its time is printed.</summary>
    private readonly record struct PlainValues(double Time, double Value, TimePrecision.Printed Printed);

    /// <summary>
    /// Parses the usual data row without splitting it into strings: unquoted fields of plain numbers, as many as the row
    /// must have. Anything else (quotes, a decimal comma, a word, a missing or extra field) returns false and the row is
    /// read field by field, which reports what is wrong. A row this accepts, that reading would take the same way. Reads
    /// only settings fixed once the data start, so rows may be parsed side by side.
    /// </summary>
    private bool TryParsePlainRow(string line, out PlainValues values)
    {
        values = default;
        if (line.Contains('"')) return false;
        ReadOnlySpan<char> rest = line, time = default, signal = default;
        int count = 0, nonEmpty = 0;
        while (true)
        {
            int next = rest.IndexOf(_format!.Delimiter);
            var field = (next < 0 ? rest : rest[..next]).Trim();
            if (count == _timeIndex) time = field;
            if (count == _signalIndex) signal = field;
            count++;
            // Empty fields at the end of a row are dropped (exporters that end each row with a delimiter).
            if (!field.IsEmpty) nonEmpty = count;
            if (next < 0) break;
            rest = rest[(next + 1)..];
        }
        if (nonEmpty > _expectedFields || nonEmpty < _requiredFields || nonEmpty <= Math.Max(_timeIndex, _signalIndex)) return false;
        if (!_format.TryParsePlain(time, out double t) || !_format.TryParsePlain(signal, out double v)) return false;
        double tScaled = t / _timeColumn.Divisor, vScaled = v / _signalColumn.Divisor;
        if (!double.IsFinite(tScaled) || !double.IsFinite(vScaled)) return false;
        values = new PlainValues(tScaled, vScaled, TimePrecision.Measure(time));
        return true;
    }

    /// <summary>Checks a row's time and value (range, order, sample limit) and keeps them, with how finely the time
    /// was printed (<paramref name="printed"/>).</summary>
    private void Accept(double t, double v, int ln, TimePrecision.Printed printed)
    {
        if (Math.Abs(t) > TraceCsvReader.MaxAbsTimeSeconds)
            throw new InputException(
                $"{_source}: line {ln}: time {t:G6} s is beyond ±{TraceCsvReader.MaxAbsTimeSeconds} s, far longer than any reflectometer record; check the time unit in the header (e.g. time_ns).");
        if (Math.Abs(v) > TraceCsvReader.MaxAbsVolts)
            throw new InputException(
                $"{_source}: line {ln}: value {v:G6} in column '{_signalColumn.Header}' is beyond ±{TraceCsvReader.MaxAbsVolts:0.#e0}; check the unit in the header (e.g. mv) and the file.");

        if (_times.Count > 0)
        {
            double previous = _times[^1];
            int previousLine = _lines[^1];
            if (t == previous)
                throw new InputException(
                    $"{_source}: line {ln}: time {t:G9} s repeats line {previousLine}; remove the duplicate sample, or export the times with more digits if they are printed too coarsely to tell the samples apart.");
            if (t < previous)
                throw new InputException(
                    $"{_source}: line {ln}: time {t:G9} s is earlier than {previous:G9} s on line {previousLine}; time must increase down the file (export one record, sorted by time).");
        }
        if (_times.Count >= _limits.MaxSamples)
            throw new InputException(
                $"{_source}: line {ln}: more than {_limits.MaxSamples} samples, the limit for a trace CSV; decimate or crop the record before loading it.");
        _times.Add(t);
        _values.Add(v);
        _lines.Add(ln);
        (_timePrecision ??= new TimePrecision(_timeColumn.Divisor)).Note(printed);
    }

    private double Parse(string field, CsvColumn column, int ln)
    {
        if (!_format!.TryParse(field, ln, out double value))
            throw new InputException(
                $"{_source}: line {ln}: '{field}' in column '{column.Header}' is not a number; fix or delete the line.");
        if (!double.IsFinite(value))
            throw new InputException(
                $"{_source}: line {ln}: '{field}' in column '{column.Header}' is not a finite number (NaN or infinity, often an over-range sample); re-export within range or crop the record.");
        return value / column.Divisor;
    }

    private TraceReadResult Finish()
    {
        if (!_anyContent)
            throw new InputException($"{_source}: the file is empty; export the trace again.");
        if (_format is null)
        {
            if (_firstSingleColumnLine != 0)
                throw new InputException(
                    $"{_source}: line {_firstSingleColumnLine}: only one column of numbers; a trace needs two columns, time and voltage (e.g. header time_s,volts).");
            throw new InputException(
                $"{_source}: no rows of numbers found; a trace CSV needs rows of time and voltage separated by ',', ';' or tab.");
        }
        if (_truncatedLine != 0)
            _warnings.Add($"{_source}: line {_truncatedLine}: last line has only {_truncatedFieldCount} of {_expectedFields} columns (export cut short?); dropped it.");
        if (_times.Count < 2)
            throw new InputException(
                $"{_source}: only {_times.Count} sample; a trace needs at least two (check that the whole record was exported).");

        // Copy to arrays and release the lists at once: on a record near the sample limit the lists hold
        // hundreds of megabytes that need not live through the resampling.
        double[] times = _times.ToArray(), values = _values.ToArray();
        int[] lines = _lines.ToArray();
        _times.Clear(); _times.Capacity = 0;
        _values.Clear(); _values.Capacity = 0;
        _lines.Clear(); _lines.Capacity = 0;
        var (start, interval, samples) = UniformGrid.Build(times, values, lines, _timePrecision!, _source, _warnings);
        if (_signalColumn.Quantity == ColumnQuantity.Rho) _metadata.SetDerived(TraceMetadataKeys.Unit, "rho");
        var trace = new Trace(start, interval, samples, _metadata.Values);
        return new TraceReadResult(trace, _warnings.AsReadOnly());
    }
}
