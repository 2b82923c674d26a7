using System.Text;

namespace CableFault.FrequencyDomain;

/// <summary>
/// Splits a text stream into numbered lines while counting characters, so that an oversized file (or one enormous
/// line) is refused before it fills memory. Accepts LF, CRLF and CR line ends.
/// </summary>
internal sealed class TouchstoneLineSource
{
    private readonly TextReader _reader;
    private readonly string _sourceName;
    private readonly long _maximumCharacters;
    private readonly char[] _buffer = new char[8192];
    private int _bufferLength;
    private int _bufferPosition;
    private long _charactersRead;
    private bool _endOfStream;

    internal TouchstoneLineSource(TextReader reader, string sourceName, long maximumCharacters)
    {
        _reader = reader;
        _sourceName = sourceName;
        _maximumCharacters = maximumCharacters;
    }

    /// <summary>Number of the line last returned (1-based).</summary>
    internal int LineNumber { get; private set; }

    /// <summary>The next line without its line end, or null at the end of the stream.</summary>
    internal string? ReadLine()
    {
        if (_endOfStream && _bufferPosition >= _bufferLength) return null;
        var line = new StringBuilder();
        while (true)
        {
            if (_bufferPosition >= _bufferLength && !Fill())
            {
                if (line.Length == 0 && LineNumberWouldBeEmptyTail()) return null;
                LineNumber++;
                return line.ToString();
            }
            char c = _buffer[_bufferPosition++];
            if (c == '\n')
            {
                LineNumber++;
                return line.ToString();
            }
            if (c == '\r')
            {
                if (_bufferPosition >= _bufferLength) Fill();
                if (_bufferPosition < _bufferLength && _buffer[_bufferPosition] == '\n') _bufferPosition++;
                LineNumber++;
                return line.ToString();
            }
            line.Append(c);
        }
    }

    private bool _lastCharWasLineEnd = true;

    // A stream that ends with a line end has no further (empty) line.
    private bool LineNumberWouldBeEmptyTail() => _lastCharWasLineEnd;

    private bool Fill()
    {
        if (_endOfStream) return false;
        if (_bufferLength > 0) _lastCharWasLineEnd = _buffer[_bufferLength - 1] is '\n' or '\r';
        _bufferLength = _reader.Read(_buffer, 0, _buffer.Length);
        _bufferPosition = 0;
        if (_bufferLength <= 0)
        {
            _bufferLength = 0;
            _endOfStream = true;
            return false;
        }
        _charactersRead += _bufferLength;
        if (_charactersRead > _maximumCharacters)
            throw new InputException(
                $"{_sourceName}: the file is larger than the {_maximumCharacters:N0}-character limit for Touchstone data; " +
                "thin the sweep (fewer points) or raise the limit.");
        return true;
    }
}
