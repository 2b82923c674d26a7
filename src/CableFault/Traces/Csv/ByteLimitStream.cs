namespace CableFault.Traces.Csv;

/// <summary>
/// A read-only pass-through that fails with <see cref="InputException"/> once more than a given number of bytes has
/// been read, so a non-seekable source (a pipe, a network stream) cannot feed the reader without end.
/// </summary>
internal sealed class ByteLimitStream : Stream
{
    private readonly Stream _inner;
    private readonly long _maxBytes;
    private readonly string _sourceName;
    private long _bytesRead;

    public ByteLimitStream(Stream inner, long maxBytes, string sourceName)
    {
        _inner = inner;
        _maxBytes = maxBytes;
        _sourceName = sourceName;
    }

    public override int Read(byte[] buffer, int offset, int count) => Count(_inner.Read(buffer, offset, count));

    public override int Read(Span<byte> buffer) => Count(_inner.Read(buffer));

    private int Count(int n)
    {
        _bytesRead += n;
        if (_bytesRead > _maxBytes)
            throw new InputException(
                $"{_sourceName}: larger than the {ByteCount.Describe(_maxBytes)} limit for a trace CSV; decimate or crop the record before loading it.");
        return n;
    }

    public override bool CanRead => true;
    public override bool CanSeek => false;
    public override bool CanWrite => false;
    public override long Length => throw new NotSupportedException();
    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }
    public override void Flush() { }
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
}
