namespace CableFault.FrequencyDomain;

/// <summary>How each complex network parameter is written in a Touchstone file (the option line's format field).</summary>
public enum TouchstoneDataFormat
{
    /// <summary><c>RI</c>: real part, imaginary part.</summary>
    RealImaginary,
    /// <summary><c>MA</c>: linear magnitude, angle in degrees (the Touchstone default).</summary>
    MagnitudeAngle,
    /// <summary><c>DB</c>: magnitude in decibels, 20·log10|x|, angle in degrees.</summary>
    DecibelAngle,
}
