using System.Numerics;

namespace CableFault.Analysis;

/// <summary>
/// Every dot product a_j·a_k (k ≤ j) of a set of long columns, and each column's product with one more vector: the
/// Gauss–Newton matrix JᵀJ and gradient Jᵀr of a fit. Each product comes out bit for bit as <see cref="Dot"/> would give
/// it, but the samples are taken a block at a time (kept in the first-level cache while every product uses them) and
/// four products share each load of a column, instead of streaming two whole columns per product.
/// </summary>
/// <remarks>Each product keeps its own vector of partial sums, added to in the same order as in <see cref="Dot"/> (lane
/// by lane over the samples in order), and is finished the same way, so the blocking changes no bit of the result.</remarks>
internal static class ColumnProducts
{
    /// <summary>Samples per block: 28 columns of 128 doubles fill 28 kB, within a core's first-level data cache.</summary>
    private const int BlockSamples = 128;

    /// <summary>Columns × samples × products above which rows are shared among the cores (about 10⁵ multiply-adds
    /// each: well above the cost of handing work to the thread pool).</summary>
    private const long ParallelMinimumWork = 400_000;

    /// <summary>
    /// The products of <paramref name="columns"/>: <c>gram[j][k] = columns[j]·columns[k]</c> for k ≤ j, and
    /// <c>withVector[j] = columns[j]·vector</c>.
    /// </summary>
    /// <param name="columns">Columns of equal length.</param>
    /// <param name="vector">One more vector of that length.</param>
    internal static (double[][] Gram, double[] WithVector) Compute(IReadOnlyList<double[]> columns, double[] vector)
    {
        int q = columns.Count;
        var gram = new double[q][];
        for (int j = 0; j < q; j++) gram[j] = new double[j + 1];
        var withVector = new double[q];
        if (q == 0) return (gram, withVector);
        int n = vector.Length;
        // Row j's operands: columns 0..j, then the vector (its product with the vector is entry j + 1).
        double[] Operand(int j, int k) => k <= j ? columns[k] : vector;
        void Row(int j, Vector<double>[] sums)
        {
            int width = Vector<double>.Count, vectorEnd = n - n % width;
            Array.Clear(sums, 0, j + 2);
            var a = columns[j];
            for (int start = 0; start < vectorEnd; start += BlockSamples)
            {
                int end = Math.Min(vectorEnd, start + BlockSamples);
                int k = 0;
                // Four products per load of column j.
                for (; k + 4 <= j + 2; k += 4)
                {
                    double[] b0 = Operand(j, k), b1 = Operand(j, k + 1), b2 = Operand(j, k + 2), b3 = Operand(j, k + 3);
                    Vector<double> s0 = sums[k], s1 = sums[k + 1], s2 = sums[k + 2], s3 = sums[k + 3];
                    for (int i = start; i < end; i += width)
                    {
                        var va = new Vector<double>(a, i);
                        s0 += va * new Vector<double>(b0, i);
                        s1 += va * new Vector<double>(b1, i);
                        s2 += va * new Vector<double>(b2, i);
                        s3 += va * new Vector<double>(b3, i);
                    }
                    sums[k] = s0;
                    sums[k + 1] = s1;
                    sums[k + 2] = s2;
                    sums[k + 3] = s3;
                }
                for (; k < j + 2; k++)
                {
                    double[] b = Operand(j, k);
                    var s = sums[k];
                    for (int i = start; i < end; i += width) s += new Vector<double>(a, i) * new Vector<double>(b, i);
                    sums[k] = s;
                }
            }
            for (int k = 0; k < j + 2; k++)
            {
                double[] b = Operand(j, k);
                double total = Vector.Dot(sums[k], Vector<double>.One);
                for (int i = vectorEnd; i < n; i++) total += a[i] * b[i];
                if (k <= j) gram[j][k] = total;
                else withVector[j] = total;
            }
        }
        long work = (long)n * q * q;
        if (work < ParallelMinimumWork)
        {
            var sums = new Vector<double>[q + 1];
            for (int j = 0; j < q; j++) Row(j, sums);
        }
        else
            // Rows in pairs from both ends (j and q − 1 − j), so each task carries about the same number of products.
            Parallel.For(0, (q + 1) / 2, () => new Vector<double>[q + 1], (t, _, sums) =>
            {
                Row(t, sums);
                if (q - 1 - t != t) Row(q - 1 - t, sums);
                return sums;
            }, _ => { });
        return (gram, withVector);
    }

    /// <summary>
    /// Each column's product with each of a few vectors (<c>result[j][v] = columns[j]·vectors[v]</c>), bit for bit as
    /// <see cref="Dot"/> gives it: one pass over each column for all the vectors, the columns shared among the cores when
    /// the work is large.
    /// </summary>
    internal static double[][] WithVectors(IReadOnlyList<double[]> columns, IReadOnlyList<double[]> vectors)
    {
        int q = columns.Count;
        var others = vectors.ToArray();
        var result = new double[q][];
        if (q == 0) return result;
        int n = columns[0].Length;
        void Column(int j)
        {
            var products = new double[others.Length];
            // Up to two vectors per pass, their sums kept in registers.
            for (int v = 0; v < others.Length; v += 2)
            {
                if (v + 1 < others.Length) (products[v], products[v + 1]) = Pair(columns[j], others[v], others[v + 1], n);
                else products[v] = Dot(columns[j], others[v]);
            }
            result[j] = products;
        }
        if ((long)n * q * others.Length < ParallelMinimumWork)
            for (int j = 0; j < q; j++) Column(j);
        else
            Parallel.For(0, q, Column);
        return result;
    }

    /// <summary>a·b and a·c in one pass, each bit for bit <see cref="Dot"/>.</summary>
    private static (double, double) Pair(double[] a, double[] b, double[] c, int n)
    {
        int width = Vector<double>.Count, i = 0;
        Vector<double> sumB = Vector<double>.Zero, sumC = Vector<double>.Zero;
        for (; i + width <= n; i += width)
        {
            var va = new Vector<double>(a, i);
            sumB += va * new Vector<double>(b, i);
            sumC += va * new Vector<double>(c, i);
        }
        double totalB = Vector.Dot(sumB, Vector<double>.One), totalC = Vector.Dot(sumC, Vector<double>.One);
        for (; i < n; i++)
        {
            totalB += a[i] * b[i];
            totalC += a[i] * c[i];
        }
        return (totalB, totalC);
    }

    /// <summary>Σ aᵢ·bᵢ, vectorised: lane by lane over the samples in order, then the lanes, then the samples left over.</summary>
    internal static double Dot(ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        int width = Vector<double>.Count, i = 0;
        var sum = Vector<double>.Zero;
        for (; i + width <= a.Length; i += width)
            sum += new Vector<double>(a.Slice(i, width)) * new Vector<double>(b.Slice(i, width));
        double total = Vector.Dot(sum, Vector<double>.One);
        for (; i < a.Length; i++) total += a[i] * b[i];
        return total;
    }
}
