using System.Text;

namespace CableFault.Tests.Hardening;

/// <summary>
/// Seeded mutations of a valid input file: bytes flipped, lines dropped, duplicated or swapped, numbers replaced by
/// extremes, the file cut short, junk inserted. The same seed always gives the same bytes, so a failing case is
/// reproduced from its seed alone.
/// </summary>
internal static class FuzzMutator
{
    /// <summary>Numbers that break naive parsers: overflow, underflow to a subnormal, signed zero, NaN, infinities.</summary>
    internal static readonly string[] ExtremeNumbers =
        ["1e308", "-1e308", "1e309", "-0", "0", "NaN", "nan", "1e-320", "-1e-320", "Infinity", "-Infinity", "∞", "1e", "--1", "0x10", "1,5", "4294967296", "99999999999999999999999"];

    /// <summary>The mutated bytes of <paramref name="original"/> for <paramref name="seed"/> (one to three mutations).</summary>
    internal static byte[] Mutate(byte[] original, int seed)
    {
        var random = new Random(seed);
        var bytes = new List<byte>(original);
        int count = 1 + random.Next(3);
        for (int m = 0; m < count; m++)
        {
            switch (random.Next(8))
            {
                case 0: FlipByte(bytes, random); break;
                case 1: bytes = EditLines(bytes, random, drop: true); break;
                case 2: bytes = EditLines(bytes, random, drop: false); break;
                case 3:
                case 4: bytes = ReplaceNumber(bytes, random); break;
                case 5: Truncate(bytes, random); break;
                case 6: bytes.InsertRange(random.Next(bytes.Count + 1), Junk(random)); break;
                default: bytes = SwapLines(bytes, random); break;
            }
        }
        return bytes.ToArray();
    }

    private static void Truncate(List<byte> bytes, Random random)
    {
        if (bytes.Count == 0) return;
        int keep = random.Next(bytes.Count);
        bytes.RemoveRange(keep, bytes.Count - keep);
    }

    private static void FlipByte(List<byte> bytes, Random random)
    {
        if (bytes.Count == 0) return;
        int at = random.Next(bytes.Count);
        bytes[at] = random.Next(2) == 0 ? (byte)(bytes[at] ^ (1 << random.Next(8))) : (byte)random.Next(256);
    }

    private static List<string> Lines(List<byte> bytes) => Encoding.Latin1.GetString(bytes.ToArray()).Split('\n').ToList();

    private static List<byte> Join(List<string> lines) => Encoding.Latin1.GetBytes(string.Join('\n', lines)).ToList();

    private static List<byte> EditLines(List<byte> bytes, Random random, bool drop)
    {
        var lines = Lines(bytes);
        if (lines.Count == 0) return bytes;
        int at = random.Next(lines.Count);
        if (drop) lines.RemoveAt(at);
        else lines.Insert(at, lines[at]);
        return Join(lines);
    }

    private static List<byte> SwapLines(List<byte> bytes, Random random)
    {
        var lines = Lines(bytes);
        if (lines.Count < 2) return bytes;
        int a = random.Next(lines.Count), b = random.Next(lines.Count);
        (lines[a], lines[b]) = (lines[b], lines[a]);
        return Join(lines);
    }

    private static List<byte> ReplaceNumber(List<byte> bytes, Random random)
    {
        string text = Encoding.Latin1.GetString(bytes.ToArray());
        // Find the numbers (digit runs with sign, point and exponent) and replace one of them.
        var spans = new List<(int Start, int Length)>();
        for (int i = 0; i < text.Length;)
        {
            if (char.IsAsciiDigit(text[i]) || (text[i] is '-' or '.' && i + 1 < text.Length && char.IsAsciiDigit(text[i + 1])))
            {
                int start = i;
                while (i < text.Length && (char.IsAsciiDigit(text[i]) || text[i] is '.' or 'e' or 'E' or '-' or '+')) i++;
                spans.Add((start, i - start));
            }
            else i++;
        }
        if (spans.Count == 0) return bytes;
        var (s, l) = spans[random.Next(spans.Count)];
        string replacement = ExtremeNumbers[random.Next(ExtremeNumbers.Length)];
        return Encoding.UTF8.GetBytes(text[..s]).Concat(Encoding.UTF8.GetBytes(replacement)).Concat(Encoding.Latin1.GetBytes(text[(s + l)..])).ToList();
    }

    private static byte[] Junk(Random random)
    {
        var junk = new byte[1 + random.Next(8)];
        for (int i = 0; i < junk.Length; i++)
            junk[i] = random.Next(4) switch { 0 => 0, 1 => (byte)'\r', 2 => (byte)random.Next(0x80, 0x100), _ => (byte)random.Next(0x20, 0x7F) };
        return junk;
    }
}
