namespace Atlas.WavePhysics;
