namespace Atlas.Hindcast;

/// <summary>The hindcast fields the atlas ingests, decoded to SI units.</summary>
public enum WaveVariable
{
    /// <summary>Significant wave height Hm0, metres.</summary>
    Hs,
    /// <summary>Energy period Tm-1,0, seconds.</summary>
    Te,
    /// <summary>Peak period, seconds.</summary>
    Tp,
    /// <summary>Mean direction the waves come from, degrees clockwise from true north, in [0, 360).</summary>
    Dir,
    /// <summary>Directional spread, degrees.</summary>
    Spread,
    /// <summary>Water depth below the sea surface, metres, positive down.</summary>
    Depth,
}
