using System.Collections.Immutable;
using System.Numerics;

namespace CableFault.FrequencyDomain;

/// <summary>
/// One-port reflection data as measured by a vector network analyser: the reflection coefficient Γ(f) = S11 at the
/// instrument's reference plane, referred to a real reference impedance. Immutable; validated on construction.
/// </summary>
public sealed class ReflectionData
{
    /// <summary>Creates the record. Throws <see cref="ArgumentException"/> if the lists differ in length, are empty,
    /// frequencies are negative, not finite or not strictly increasing, a value is not finite, or the reference is not positive.</summary>
    /// <param name="frequenciesHz">Measurement frequencies, Hz (≥ 0, strictly increasing).</param>
    /// <param name="reflectionCoefficients">Complex S11 at each frequency (dimensionless).</param>
    /// <param name="referenceImpedanceOhms">Real reference impedance Z_ref of S11, Ω (&gt; 0).</param>
    /// <param name="comments">Comment text from the file, in order, without the <c>!</c>.</param>
    /// <param name="fileInfo">What the file declared; null for data built in code.</param>
    /// <param name="warnings">Things the reader accepted but the user should know (one sentence each).</param>
    public ReflectionData(IReadOnlyList<double> frequenciesHz, IReadOnlyList<Complex> reflectionCoefficients,
        double referenceImpedanceOhms, IEnumerable<string>? comments = null, TouchstoneFileInfo? fileInfo = null,
        IEnumerable<string>? warnings = null)
    {
        if (frequenciesHz.Count != reflectionCoefficients.Count)
            throw new ArgumentException($"{frequenciesHz.Count} frequencies but {reflectionCoefficients.Count} reflection values.");
        if (frequenciesHz.Count == 0) throw new ArgumentException("Reflection data need at least one frequency.");
        if (!(referenceImpedanceOhms > 0) || !double.IsFinite(referenceImpedanceOhms))
            throw new ArgumentException($"Reference impedance {referenceImpedanceOhms} Ω must be a positive number.");
        for (int i = 0; i < frequenciesHz.Count; i++)
        {
            double f = frequenciesHz[i];
            if (!(f >= 0) || !double.IsFinite(f)) throw new ArgumentException($"Frequency {i} ({f} Hz) must be a finite number ≥ 0.");
            if (i > 0 && !(f > frequenciesHz[i - 1])) throw new ArgumentException($"Frequency {i} ({f} Hz) is not above the previous one.");
            var g = reflectionCoefficients[i];
            if (!double.IsFinite(g.Real) || !double.IsFinite(g.Imaginary)) throw new ArgumentException($"Reflection value {i} is not finite.");
        }
        FrequenciesHz = frequenciesHz.ToImmutableArray();
        ReflectionCoefficients = reflectionCoefficients.ToImmutableArray();
        ReferenceImpedanceOhms = referenceImpedanceOhms;
        Comments = (comments ?? []).ToImmutableArray();
        FileInfo = fileInfo;
        Warnings = (warnings ?? []).ToImmutableArray();
    }

    /// <summary>Measurement frequencies, Hz, strictly increasing.</summary>
    public ImmutableArray<double> FrequenciesHz { get; }

    /// <summary>Γ(f) = S11 at each frequency, referred to <see cref="ReferenceImpedanceOhms"/>.</summary>
    public ImmutableArray<Complex> ReflectionCoefficients { get; }

    /// <summary>Reference impedance of Γ, Ω.</summary>
    public double ReferenceImpedanceOhms { get; }

    /// <summary>Comments from the file.</summary>
    public ImmutableArray<string> Comments { get; }

    /// <summary>What the file declared, or null.</summary>
    public TouchstoneFileInfo? FileInfo { get; }

    /// <summary>Reader warnings.</summary>
    public ImmutableArray<string> Warnings { get; }

    /// <summary>Number of frequency points.</summary>
    public int Count => FrequenciesHz.Length;
}
