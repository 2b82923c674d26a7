using System.Text;

namespace CableFault.Traces.Csv;

/// <summary>
/// Splits a <see cref="TextReader"/> into numbered lines (LF, CRLF or lone CR) while enforcing a limit on the total
/// number of characters and on the length of any one line. <see cref="TextReader.ReadLine"/> is not used because a
/// file with no line breaks would make it build one arbitrarily long string before we could object.
/// </summary>
internal sealed class CsvLineSource
{
    private readonly TextReader _reader;
    private readonly string _sourceName;
    private readonly long _maxChars;
    private readonly int _maxLineChars;
    private readonly char[] _buffer = new char[16 * 1024];
    private readonly StringBuilder _line = new();
    private int _bufferLength;
    private int _bufferPosition;
    private long _charsRead;
    private bool _pendingCarriageReturn;
    private bool _endOfInput;

    public CsvLineSource(TextReader reader, string sourceName, long maxChars, int maxLineChars)
    {
        _reader = reader;
        _sourceName = sourceName;
        _maxChars = maxChars;
        _maxLineChars = maxLineChars;
    }

    /// <summary>1-based number of the line most recently returned by <see cref="TryReadLine"/>.</summary>
    public int LineNumber { get; private set; }

    /// <summary>Reads the next line without its terminator; false at the end of the input.</summary>
    public bool TryReadLine(out string line)
    {
        _line.Clear();
        bool sawAnything = false;
        while (true)
        {
            if (_bufferPosition == _bufferLength && !Fill())
            {
                if (!sawAnything)
                {
                    line = "";
                    return false;
                }
                break;
            }

            if (_pendingCarriageReturn)
            {
                _pendingCarriageReturn = false;
                if (_buffer[_bufferPosition] == '\n')
                {
                    _bufferPosition++; // second half of CRLF
                    continue;
                }
            }
            sawAnything = true;
            // The rest of the line within the buffer at once (a character at a time was a tenth of a locate's start).
            var rest = _buffer.AsSpan(_bufferPosition, _bufferLength - _bufferPosition);
            int end = rest.IndexOfAny('\r', '\n');
            int take = end < 0 ? rest.Length : end;
            if (_line.Length + take > _maxLineChars)
                throw new InputException(
                    $"{_sourceName}: line {LineNumber + 1}: longer than {_maxLineChars} characters; this does not look like a trace CSV (two columns per line), check the file.");
            _line.Append(rest[..take]);
            _bufferPosition += take;
            if (end < 0) continue;
            if (_buffer[_bufferPosition++] == '\r') _pendingCarriageReturn = true;
            break;
        }

        LineNumber++;
        line = _line.ToString();
        if (LineNumber == 1 && line.Length > 0 && line[0] == '\uFEFF')
            line = line[1..]; // a byte-order mark left in by a reader that did not strip it
        return true;
    }

    private bool Fill()
    {
        if (_endOfInput) return false;
        _bufferLength = _reader.Read(_buffer, 0, _buffer.Length);
        _bufferPosition = 0;
        if (_bufferLength == 0)
        {
            _endOfInput = true;
            return false;
        }
        _charsRead += _bufferLength;
        if (_charsRead > _maxChars)
            throw new InputException(
                $"{_sourceName}: larger than the {ByteCount.Describe(_maxChars)} limit for a trace CSV; decimate or crop the record before loading it.");
        return true;
    }
}
