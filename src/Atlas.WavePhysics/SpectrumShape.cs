namespace Atlas.WavePhysics;

/// <summary>The assumed spectral shape when only the peak period of a sea state is known.</summary>
public enum SpectrumShape
{
    /// <summary>JONSWAP with peak enhancement gamma = 3.3: Te = 0.9 Tp.</summary>
    JonswapGamma33 = 0,

    /// <summary>Pierson-Moskowitz (fully developed sea): Te = 0.857 Tp.</summary>
    PiersonMoskowitz = 1,
}
