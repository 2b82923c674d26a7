namespace CableFault.Analysis;

/// <summary>
/// A model Jacobian kept up to date between finite-difference evaluations by Broyden's rank-one secant update,
/// J₊ = J + (Δf − J·Δu)·Δuᵀ / (Δuᵀ·Δu) (Broyden, <i>Math. Comp.</i> 19, 1965; used inside Levenberg–Marquardt as in
/// Madsen, Nielsen &amp; Tingleff, <i>Methods for Non-Linear Least Squares Problems</i>, 2nd ed., 2004, §3.4).
/// </summary>
/// <remarks>
/// A finite-difference Jacobian costs one forward model per free parameter; the update costs none (the model at the
/// new point is already known from LM's step test). After <see cref="MaximumUpdates"/> updates the next Jacobian is a
/// finite-difference one again, so the secant error cannot build up. Columns that are exact for free (the amplitude
/// and level offset) are passed in and are not updated. The Gauss–Newton products JᵀJ follow the same rank-one change
/// (see <see cref="Products"/>), so an updated step costs a few column products rather than p(p + 1)/2.
/// </remarks>
internal sealed class SecantJacobian(int parameterCount, bool[] free)
{
    /// <summary>Secant updates between finite-difference Jacobians: enough to save most of the model runs of a fit,
    /// few enough that LM's steps stay about as good as with exact derivatives.</summary>
    internal const int MaximumUpdates = 3;

    private double[]? pointU;
    private double[]? valuesAtPoint;
    private int updates;
    private bool forceExact;

    /// <summary>Indices of the free parameters, in order: the columns whose products <see cref="Products"/> gives.</summary>
    private readonly int[] freeIndices = Enumerable.Range(0, parameterCount).Where(j => free[j]).ToArray();

    /// <summary>The free columns' products at the current point (row a holds a·b for b ≤ a, in the order of
    /// <see cref="freeIndices"/>), or null until <see cref="Products"/> is first asked at this Jacobian.</summary>
    private double[][]? gram;

    /// <summary>Free columns (by position in <see cref="freeIndices"/>) replaced by exact ones since the products were
    /// last given: their products are taken afresh by <see cref="Products"/>.</summary>
    private readonly bool[] retake = new bool[free.Count(f => f)];

    /// <summary>The Jacobian's columns ∂f/∂u_j at the current point (zero arrays for fixed parameters).</summary>
    internal double[][]? Columns { get; private set; }

    /// <summary>True when the current columns came from at least one secant update.</summary>
    internal bool IsUpdated => updates > 0;

    /// <summary>True when a secant update may be used for the next point.</summary>
    internal bool CanUpdate => Columns is not null && !forceExact && updates < MaximumUpdates;

    /// <summary>True when the columns are for point <paramref name="u"/>.</summary>
    internal bool IsAt(double[] u) => pointU is not null && u.AsSpan().SequenceEqual(pointU);

    /// <summary>The next Jacobian is a finite-difference one.</summary>
    internal void ForceExact() => forceExact = true;

    /// <summary>Starts afresh from a finite-difference Jacobian at <paramref name="u"/>, where the model is <paramref name="f"/>.
    /// Takes ownership of <paramref name="columns"/>: later updates change those arrays in place.</summary>
    internal void Reset(double[] u, double[] f, double[][] columns)
    {
        pointU = u;
        valuesAtPoint = f;
        Columns = columns;
        updates = 0;
        forceExact = false;
        gram = null;
        Array.Clear(retake);
    }

    /// <summary>
    /// The free columns' Gauss–Newton products JᵀJ (as <see cref="ColumnProducts.Compute"/> gives them) and their products
    /// with <paramref name="vector"/>. After a finite-difference Jacobian every product is taken; after a secant update the
    /// products kept from the last point are carried over by the update's own algebra (see <see cref="Update"/>), which
    /// costs a few column products instead of p(p + 1)/2.
    /// </summary>
    internal (double[][] Gram, double[] WithVector) Products(double[] vector)
    {
        var columns = Array.ConvertAll(freeIndices, j => Columns![j]);
        if (gram is null)
        {
            (gram, var withVector) = ColumnProducts.Compute(columns, vector);
            return (gram, withVector);
        }
        // One pass over the columns: each with the vector, and with the columns known exactly at this point, whose
        // products the update did not carry.
        var exact = Enumerable.Range(0, freeIndices.Length).Where(a => retake[a]).ToArray();
        var products = ColumnProducts.WithVectors(columns, [vector, .. exact.Select(a => columns[a])]);
        for (int e = 0; e < exact.Length; e++)
        {
            int a = exact[e];
            for (int b = 0; b < freeIndices.Length; b++)
                if (b <= a) gram[a][b] = products[b][e + 1];
                else gram[b][a] = products[b][e + 1];
        }
        Array.Clear(retake);
        return (gram, Array.ConvertAll(products, row => row[0]));
    }

    /// <summary>Moves to <paramref name="u"/> (model <paramref name="f"/>) by the secant update; <paramref name="exactColumns"/>
    /// holds the columns known exactly at the new point (null entries are updated).</summary>
    internal void Update(double[] u, double[] f, double[]?[] exactColumns)
    {
        var old = Columns!;
        int n = f.Length;
        var next = new double[parameterCount][];
        for (int j = 0; j < parameterCount; j++) next[j] = exactColumns[j] ?? old[j];
        var du = new double[parameterCount];
        double norm2 = 0;
        for (int j = 0; j < parameterCount; j++)
        {
            if (!free[j]) continue;
            du[j] = u[j] - pointU![j];
            if (exactColumns[j] is null) norm2 += du[j] * du[j];
        }
        if (norm2 > 0)
        {
            // r = Δf − J·Δu with the exact columns already at the new point: what the linear model missed.
            var r = new double[n];
            for (int i = 0; i < n; i++) r[i] = f[i] - valuesAtPoint![i];
            for (int j = 0; j < parameterCount; j++)
            {
                if (du[j] == 0) continue;
                var col = next[j];
                for (int i = 0; i < n; i++) r[i] -= col[i] * du[j];
            }
            // The kept products follow the rank-one change J′ = J + r·tᵀ (t_j = Δu_j/‖Δu‖² on the updated columns):
            // J′ᵀJ′ = JᵀJ + c·tᵀ + t·cᵀ + (r·r)·t·tᵀ with c = Jᵀr, taken before the columns change. The exact columns'
            // products are taken afresh by Products.
            if (gram is not null) CarryProducts(old, exactColumns, r, du, norm2);
            // In place: the old columns are read by nothing once r is known (LM takes its products at once), and a
            // fresh copy of every column per step made the allocator a large share of a long fit's time.
            for (int j = 0; j < parameterCount; j++)
            {
                if (!free[j] || exactColumns[j] is not null || du[j] == 0) continue;
                var col = old[j];
                double w = du[j] / norm2;
                for (int i = 0; i < n; i++) col[i] += r[i] * w;
            }
        }
        if (gram is not null)
            for (int a = 0; a < freeIndices.Length; a++)
                if (exactColumns[freeIndices[a]] is not null) retake[a] = true;
        pointU = u;
        valuesAtPoint = f;
        Columns = next;
        updates++;
    }

    /// <summary>The rank-one change of the updated columns' products (see <see cref="Update"/>).</summary>
    private void CarryProducts(double[][] old, double[]?[] exactColumns, double[] r, double[] du, double norm2)
    {
        int count = freeIndices.Length;
        var updated = Enumerable.Range(0, count).Where(a => exactColumns[freeIndices[a]] is null).ToArray();
        var withR = ColumnProducts.WithVectors(Array.ConvertAll(updated, a => old[freeIndices[a]]), [r]);
        var c = new double[count];
        var t = new double[count];
        for (int k = 0; k < updated.Length; k++)
        {
            int a = updated[k];
            c[a] = withR[k][0];
            t[a] = du[freeIndices[a]] / norm2;
        }
        double rr = ColumnProducts.Dot(r, r);
        for (int a = 0; a < count; a++)
        {
            if (exactColumns[freeIndices[a]] is not null) continue;
            for (int b = 0; b <= a; b++)
                if (exactColumns[freeIndices[b]] is null) gram![a][b] += t[b] * c[a] + t[a] * c[b] + t[a] * t[b] * rr;
        }
    }
}
