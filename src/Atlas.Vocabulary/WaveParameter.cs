using System.Text.Json.Serialization;

namespace Atlas.Vocabulary;

/// <summary>The parameters of the atlas, by their trade symbols (see <see cref="WaveParameterNames"/>); JSON carries the symbol.</summary>
[JsonConverter(typeof(WaveParameterJsonConverter))]
public enum WaveParameter
{
    /// <summary>Spectral significant wave height Hm0, m ("hs").</summary>
    Hs,

    /// <summary>Energy period Tm-1,0, s ("te").</summary>
    Te,

    /// <summary>Peak period, s ("tp").</summary>
    Tp,

    /// <summary>Omnidirectional wave power, kW/m ("j").</summary>
    J,

    /// <summary>Mean direction the waves come from, degrees true ("dir").</summary>
    Dir,

    /// <summary>Directional spread, degrees ("spread").</summary>
    Spread,

    /// <summary>Directionality coefficient, dimensionless 0..1 ("d").</summary>
    D,

    /// <summary>Still-water depth, m ("depth").</summary>
    Depth,
}
