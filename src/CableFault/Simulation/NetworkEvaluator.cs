using System.Numerics;
using CableFault.Cables;

namespace CableFault.Simulation;

/// <summary>
/// Evaluates the input impedance of a compiled network at one complex frequency s, as a homogeneous pair (N, D), Z = N/D.
/// </summary>
/// <remarks>
/// Each segment applies its ABCD matrix (Pozar, <i>Microwave Engineering</i>, 4th ed., Table 4.1):
/// A = D = cosh γl, B = Z_c sinh γl, C = sinh γl / Z_c, so N′ = A·N + B·D and D′ = C·N + A·D, which is
/// Z_in = Z_c (Z_L + Z_c tanh γl)/(Z_c + Z_L tanh γl). All four entries are scaled by e^(−γl) (a common factor cancels
/// in N/D), so a very lossy segment cannot overflow: cosh → (1 + e)/2, sinh → (1 − e)/2, e = e^(−2γl).
/// Junction branches combine as parallel admittances; shunt parts add admittance, series parts add impedance.
/// </remarks>
internal sealed class NetworkEvaluator
{
    private readonly CompiledNetwork _network;
    private readonly Complex[] _stackN;
    private readonly Complex[] _stackD;
    private readonly Complex[] _gamma;
    private readonly Complex[] _zc;
    private readonly Complex[] _zSeries;
    private readonly Complex[] _yShunt;

    internal NetworkEvaluator(CompiledNetwork network)
    {
        _network = network;
        _stackN = new Complex[network.MaxStackDepth + 1];
        _stackD = new Complex[network.MaxStackDepth + 1];
        _gamma = new Complex[network.Media.Length];
        _zc = new Complex[network.Media.Length];
        _zSeries = new Complex[network.Media.Length];
        _yShunt = new Complex[network.Media.Length];
    }

    /// <summary>Input impedance pair at complex frequency s (rad/s).</summary>
    internal (Complex N, Complex D) Evaluate(Complex s)
    {
        var media = _network.Media;
        for (int m = 0; m < media.Length; m++)
        {
            var medium = media[m];
            if (medium.IsLossless)
            {
                _gamma[m] = s / medium.VelocityMetersPerSecond;
                _zc[m] = medium.ImpedanceOhms;
                _zSeries[m] = s * medium.InductanceHenriesPerMeter;
                _yShunt[m] = s * medium.CapacitanceFaradsPerMeter;
            }
            else
            {
                Complex z = medium.SeriesImpedanceOhmsPerMeter(s), y = medium.ShuntAdmittanceSiemensPerMeter(s);
                Complex gamma = Complex.Sqrt(z * y);
                _gamma[m] = gamma;
                _zc[m] = gamma == Complex.Zero ? medium.ImpedanceOhms : z / gamma;
                _zSeries[m] = z;
                _yShunt[m] = y;
            }
        }

        int top = -1;
        foreach (var op in _network.Ops)
        {
            switch (op.Kind)
            {
                case CompiledNetwork.OpKind.Open: top++; _stackN[top] = 1; _stackD[top] = 0; break;
                case CompiledNetwork.OpKind.Short: top++; _stackN[top] = 0; _stackD[top] = 1; break;
                case CompiledNetwork.OpKind.Resistor: top++; _stackN[top] = op.Value; _stackD[top] = 1; break;
                case CompiledNetwork.OpKind.Matched: top++; _stackN[top] = _zc[op.Medium]; _stackD[top] = 1; break;
                case CompiledNetwork.OpKind.ResistorParallelCapacitor:
                    top++; _stackN[top] = op.Value; _stackD[top] = 1 + s * op.Value * op.Value2; break;
                case CompiledNetwork.OpKind.ShuntC: _stackD[top] += s * op.Value * _stackN[top]; break;
                case CompiledNetwork.OpKind.ShuntR: _stackD[top] += _stackN[top] / op.Value; break;
                case CompiledNetwork.OpKind.SeriesL: _stackN[top] += s * op.Value * _stackD[top]; break;
                case CompiledNetwork.OpKind.SeriesR: _stackN[top] += op.Value * _stackD[top]; break;
                case CompiledNetwork.OpKind.Segment:
                    ApplySegment(ref _stackN[top], ref _stackD[top], _gamma[op.Medium] * op.Value,
                        _zc[op.Medium], _zSeries[op.Medium] * op.Value, _yShunt[op.Medium] * op.Value);
                    break;
                case CompiledNetwork.OpKind.Junction:
                    for (int b = 1; b < op.Count; b++)
                    {
                        Complex n1 = _stackN[top - 1], d1 = _stackD[top - 1], n2 = _stackN[top], d2 = _stackD[top];
                        top--;
                        _stackN[top] = n1 * n2;
                        _stackD[top] = d1 * n2 + d2 * n1;
                        Normalise(ref _stackN[top], ref _stackD[top]);
                    }
                    break;
            }
        }
        return (_stackN[0], _stackD[0]);
    }

    /// <summary>Applies a segment's ABCD matrix to a load pair, scaled by e^(−γl).</summary>
    internal static void ApplySegment(ref Complex n, ref Complex d, Complex gammaLength, Complex zc, Complex zSeriesTotal, Complex yShuntTotal)
    {
        Complex a, b, c;
        if (gammaLength.Magnitude < 1e-4)
        {
            // Small-argument series, exact to O((γl)^4): avoids 0/0 in Z_c = Z′/γ at s → 0.
            Complex g2 = gammaLength * gammaLength;
            a = 1 + g2 / 2;
            Complex sinhc = 1 + g2 / 6;
            b = zSeriesTotal * sinhc;
            c = yShuntTotal * sinhc;
        }
        else
        {
            Complex e = Complex.Exp(-2 * gammaLength);
            a = (1 + e) * 0.5;
            Complex sh = (1 - e) * 0.5;
            b = zc * sh;
            c = sh / zc;
        }
        Complex newN = a * n + b * d;
        Complex newD = c * n + a * d;
        n = newN;
        d = newD;
        Normalise(ref n, ref d);
    }

    internal static void Normalise(ref Complex n, ref Complex d)
    {
        double scale = Math.Max(Math.Abs(n.Real) + Math.Abs(n.Imaginary), Math.Abs(d.Real) + Math.Abs(d.Imaginary));
        if (scale > 0 && double.IsFinite(scale) && (scale > 1e100 || scale < 1e-100))
        {
            n /= scale;
            d /= scale;
        }
    }
}
