using System.Buffers.Binary;

namespace CableFault.History;

/// <summary>Samples as a BLOB: IEEE 754 doubles, little-endian, 8 bytes each (exact round trip, any platform).</summary>
internal static class SampleBlob
{
    internal static byte[] Encode(IReadOnlyList<double> samples)
    {
        var bytes = new byte[samples.Count * sizeof(double)];
        for (int i = 0; i < samples.Count; i++) BinaryPrimitives.WriteDoubleLittleEndian(bytes.AsSpan(i * sizeof(double)), samples[i]);
        return bytes;
    }

    internal static double[] Decode(byte[] bytes)
    {
        var samples = new double[bytes.Length / sizeof(double)];
        for (int i = 0; i < samples.Length; i++) samples[i] = BinaryPrimitives.ReadDoubleLittleEndian(bytes.AsSpan(i * sizeof(double)));
        return samples;
    }
}
