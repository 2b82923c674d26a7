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
/// and level offset) are passed in and are not updated.
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
        pointU = u;
        valuesAtPoint = f;
        Columns = next;
        updates++;
    }
}
