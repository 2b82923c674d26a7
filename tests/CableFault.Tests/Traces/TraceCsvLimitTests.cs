using System.Text;
using CableFault.Traces;
using CableFault.Traces.Csv;

namespace CableFault.Tests.Traces;

/// <summary>
/// Size limits: big inputs are refused before they are read whole. No big file is made; fake streams report a huge
/// length or produce bytes lazily and record how much was taken from them.
/// </summary>
public class TraceCsvLimitTests
{
    /// <summary>
    /// How far past a limit the reader may have pulled bytes before noticing: one StreamReader buffer (16 KiB, our
    /// choice) plus one decoder/line buffer of 16 Ki chars, doubled for slack. Well under a megabyte, which is what
    /// "stops at the limit" needs to mean next to a 200 MB limit.
    /// </summary>
    private const long ReadAheadAllowanceBytes = 4 * 16 * 1024;

    [Fact]
    public void Seekable_stream_longer_than_the_limit_is_refused_before_any_read()
    {
        var stream = new FakeHugeStream(length: TraceCsvReader.MaxInputBytes + 1);
        var ex = Assert.Throws<InputException>(() => TraceCsvReader.Read(stream, "huge.csv"));
        Assert.StartsWith("huge.csv: ", ex.Message);
        Assert.Contains("larger than the 200 MB limit", ex.Message);
        Assert.Equal(0, stream.ReadCalls);
    }

    [Fact]
    public void Seekable_stream_is_measured_from_its_current_position()
    {
        // 10 GB long but positioned 60 bytes from the end: only what is left counts.
        var payload = Encoding.ASCII.GetBytes("time_ns,volts\n0,1\n1,2\n");
        var stream = new FakeHugeStream(length: 10_000_000_000, tail: payload);
        var trace = TraceCsvReader.Read(stream, "tail.csv");
        Assert.Equal(2, trace.Length);
    }

    [Fact]
    public void Endless_non_seekable_stream_is_stopped_at_the_byte_limit()
    {
        const long limit = 100_000;
        var stream = new EndlessTraceStream(withLineBreaks: true);
        var limits = new TraceCsvLimits(limit, TraceCsvReader.MaxSamples, TraceCsvReader.MaxLineChars);
        var ex = Assert.Throws<InputException>(() => TraceCsvReader.ReadWithWarnings(stream, "pipe.csv", limits));
        Assert.Contains("larger than the 100000 bytes limit", ex.Message);
        Assert.InRange(stream.BytesServed, limit, limit + ReadAheadAllowanceBytes);
    }

    [Fact]
    public void Endless_stream_without_line_breaks_is_stopped_at_the_line_limit_with_default_limits()
    {
        var stream = new EndlessTraceStream(withLineBreaks: false);
        var ex = Assert.Throws<InputException>(() => TraceCsvReader.Read(stream, "noise.bin"));
        Assert.Contains("line 1: longer than 65536 characters", ex.Message);
        Assert.InRange(stream.BytesServed, TraceCsvReader.MaxLineChars, TraceCsvReader.MaxLineChars + ReadAheadAllowanceBytes);
    }

    /// <summary>The line limit counts a line's characters across the reader's 16 384-character blocks: a data row padded
    /// to exactly the limit (spanning several blocks) is read, one character more is refused with its line number.</summary>
    [Fact]
    public void A_line_of_exactly_the_limit_spanning_blocks_is_read_and_one_more_character_is_refused()
    {
        string Row(int length) => "1e-9,0.5".PadRight(length);
        string Text(int length) => "time_s,volts\n0,0.25\n" + Row(length) + "\n2e-9,0.75\n";
        var read = TraceCsvReader.ReadWithWarnings(new StringReader(Text(TraceCsvReader.MaxLineChars)), "wide.csv");
        Assert.Equal([0.25, 0.5, 0.75], read.Trace.SamplesVolts.ToArray());
        var ex = Assert.Throws<InputException>(() => TraceCsvReader.ReadWithWarnings(new StringReader(Text(TraceCsvReader.MaxLineChars + 1)), "wide.csv"));
        Assert.Contains("line 3: longer than 65536 characters", ex.Message);
    }

    [Fact]
    public void Text_reader_input_is_counted_in_characters()
    {
        var text = "time_ns,volts\n" + string.Concat(Enumerable.Range(0, 10_000).Select(i => $"{i},0.5\n"));
        var limits = new TraceCsvLimits(50_000, TraceCsvReader.MaxSamples, TraceCsvReader.MaxLineChars);
        var ex = Assert.Throws<InputException>(() => TraceCsvReader.ReadWithWarnings(new StringReader(text), "t.csv", limits));
        Assert.Contains("larger than the 50000 bytes limit", ex.Message);
    }

    [Fact]
    public void Sample_count_limit_names_the_first_line_beyond_it()
    {
        var text = "time_ns,volts\n" + string.Concat(Enumerable.Range(0, 2_000).Select(i => $"{i},0.5\n"));
        var limits = new TraceCsvLimits(TraceCsvReader.MaxInputBytes, 1_000, TraceCsvReader.MaxLineChars);
        var ex = Assert.Throws<InputException>(() => TraceCsvReader.ReadWithWarnings(new StringReader(text), "t.csv", limits));
        // Header on line 1, sample k on line k + 2: sample 1001 (index 1000) is on line 1002.
        Assert.StartsWith("t.csv: line 1002: more than 1000 samples", ex.Message);
    }

    /// <summary>Claims a huge length; serves only <c>tail</c>, positioned at its end.</summary>
    private sealed class FakeHugeStream(long length, byte[]? tail = null) : Stream
    {
        private readonly byte[] _tail = tail ?? [];
        private long _position = length - (tail?.Length ?? length);

        public int ReadCalls { get; private set; }
        public override bool CanRead => true;
        public override bool CanSeek => true;
        public override bool CanWrite => false;
        public override long Length => length;
        public override long Position { get => _position; set => _position = value; }

        public override int Read(byte[] buffer, int offset, int count)
        {
            ReadCalls++;
            long tailStart = length - _tail.Length;
            if (_position < tailStart) throw new InvalidOperationException("read outside the served tail");
            int n = (int)Math.Min(count, length - _position);
            Array.Copy(_tail, _position - tailStart, buffer, offset, n);
            _position += n;
            return n;
        }

        public override void Flush() { }
        public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
        public override void SetLength(long value) => throw new NotSupportedException();
        public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    }

    /// <summary>A never-ending, non-seekable trace: "time_ns,volts" then rows "k,0.5"; or digits with no line break.</summary>
    private sealed class EndlessTraceStream(bool withLineBreaks) : Stream
    {
        private byte[] _pending = Encoding.ASCII.GetBytes(withLineBreaks ? "time_ns,volts\n" : "");
        private int _pendingOffset;
        private long _row;

        public long BytesServed { get; private set; }
        public override bool CanRead => true;
        public override bool CanSeek => false;
        public override bool CanWrite => false;
        public override long Length => throw new NotSupportedException();
        public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }

        public override int Read(byte[] buffer, int offset, int count)
        {
            if (_pendingOffset == _pending.Length)
            {
                _pending = Encoding.ASCII.GetBytes(withLineBreaks ? $"{_row},0.5\n" : "0123456789");
                _pendingOffset = 0;
                _row++;
            }
            int n = Math.Min(count, _pending.Length - _pendingOffset);
            Array.Copy(_pending, _pendingOffset, buffer, offset, n);
            _pendingOffset += n;
            BytesServed += n;
            return n;
        }

        public override void Flush() { }
        public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
        public override void SetLength(long value) => throw new NotSupportedException();
        public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    }
}
