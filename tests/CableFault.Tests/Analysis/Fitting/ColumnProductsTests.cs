using CableFault.Analysis;
using Xunit;

namespace CableFault.Tests.Analysis.Fitting;

/// <summary>
/// The blocked Gauss–Newton products against two references: the plain dot product of each pair (the blocking must not
/// change a bit, so fits give the same results whatever the block size or the number of cores), and an exactly rounded
/// sum (Neumaier's compensated summation of the products, each product split exactly by Dekker's two-product, so the
/// reference is good to about one ulp of the sum).
/// </summary>
public sealed class ColumnProductsTests
{
    [Theory]
    // Short and serial; one block with a ragged tail; many blocks in parallel, with every remainder of four products.
    [InlineData(37, 3)]
    [InlineData(130, 5)]
    [InlineData(6_107, 13)]
    [InlineData(6_107, 14)]
    [InlineData(2_049, 27)]
    public void EveryProductIsThePlainDotProductBitForBit(int sampleCount, int columnCount)
    {
        var (columns, vector) = RandomColumns(sampleCount, columnCount, seed: sampleCount + columnCount);

        var (gram, withVector) = ColumnProducts.Compute(columns, vector);

        for (int j = 0; j < columnCount; j++)
        {
            Assert.Equal(j + 1, gram[j].Length);
            for (int k = 0; k <= j; k++) Assert.Equal(ColumnProducts.Dot(columns[j], columns[k]), gram[j][k]);
            Assert.Equal(ColumnProducts.Dot(columns[j], vector), withVector[j]);
        }
    }

    /// <summary>Each column's products with a few vectors, taken in one pass (serially for a short set, spread over the
    /// cores for a long one), must be the plain dot products bit for bit.</summary>
    [Theory]
    [InlineData(37, 3, 1)]
    [InlineData(6_107, 20, 3)]
    public void ProductsWithVectorsAreThePlainDotProductsBitForBit(int sampleCount, int columnCount, int vectorCount)
    {
        var (columns, _) = RandomColumns(sampleCount, columnCount, seed: 3 * sampleCount);
        var vectors = Enumerable.Range(0, vectorCount).Select(v => RandomColumns(sampleCount, 1, seed: 100 + v).Vector).ToArray();

        var products = ColumnProducts.WithVectors(columns, vectors);

        for (int j = 0; j < columnCount; j++)
            for (int v = 0; v < vectorCount; v++) Assert.Equal(ColumnProducts.Dot(columns[j], vectors[v]), products[j][v]);
    }

    [Fact]
    public void ProductsAgreeWithAnExactlyRoundedSum()
    {
        var (columns, vector) = RandomColumns(6_107, 9, seed: 5);

        var (gram, withVector) = ColumnProducts.Compute(columns, vector);

        // 6 107 terms of size ~0.1 summed in 4 lanes: the rounding error is far below 1e-12 of the sum of magnitudes.
        for (int j = 0; j < columns.Length; j++)
        {
            for (int k = 0; k <= j; k++) AssertClose(columns[j], columns[k], gram[j][k]);
            AssertClose(columns[j], vector, withVector[j]);
        }
    }

    [Fact]
    public void NoColumnsGiveNoProducts()
    {
        var (gram, withVector) = ColumnProducts.Compute([], [1.0, 2.0]);
        Assert.Empty(gram);
        Assert.Empty(withVector);
    }

    private static void AssertClose(double[] a, double[] b, double actual)
    {
        double magnitude = a.Zip(b, (x, y) => Math.Abs(x * y)).Sum();
        Assert.Equal(ExactDot(a, b), actual, 1e-12 * magnitude);
    }

    private static (double[][] Columns, double[] Vector) RandomColumns(int sampleCount, int columnCount, int seed)
    {
        var random = new Random(seed);
        double[] Column() => Enumerable.Range(0, sampleCount).Select(_ => random.NextDouble() - 0.5).ToArray();
        return (Enumerable.Range(0, columnCount).Select(_ => Column()).ToArray(), Column());
    }

    /// <summary>Σ aᵢbᵢ with each product split exactly (Dekker, <i>Numer. Math.</i> 18, 1971, by Math.FusedMultiplyAdd)
    /// and the parts summed by Neumaier's compensated summation (<i>ZAMM</i> 54, 1974).</summary>
    private static double ExactDot(double[] a, double[] b)
    {
        double sum = 0, compensation = 0;
        void Add(double x)
        {
            double t = sum + x;
            compensation += Math.Abs(sum) >= Math.Abs(x) ? (sum - t) + x : (x - t) + sum;
            sum = t;
        }
        for (int i = 0; i < a.Length; i++)
        {
            double product = a[i] * b[i];
            Add(product);
            Add(Math.FusedMultiplyAdd(a[i], b[i], -product));
        }
        return sum + compensation;
    }
}
