namespace Atlas.Assessment.Access;

/// <summary>How one step stands against the access limits.</summary>
internal enum SeaStateClass : sbyte
{
    /// <summary>Hs (or Tp, when limited) is missing: neither calm nor storm; it breaks every spell.</summary>
    Missing = -1,
    /// <summary>Beyond a limit.</summary>
    Storm = 0,
    /// <summary>Within all limits.</summary>
    Calm = 1,
}
