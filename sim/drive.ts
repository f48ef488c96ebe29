/** Prescribed drive motion: chain speed rises linearly from 0 to `speed` over `rampTime`, then holds. */
export interface DriveMotion {
  displacement(t: number): number;
  velocity(t: number): number;
  acceleration(t: number): number;
}

export function driveMotion(speed: number, rampTime: number): DriveMotion {
  // A ramp shorter than a microsecond is a sudden start (its acceleration would be meaningless).
  if (rampTime < 1e-6) {
    // A sudden start: full speed from t = 0 on (the chain stations keep their absolute rest at t = 0).
    return {
      displacement: (t) => (t > 0 ? speed * t : 0),
      velocity: (t) => (t >= 0 ? speed : 0),
      acceleration: () => 0,
    };
  }
  return {
    displacement: (t) =>
      t <= 0 ? 0 : t < rampTime ? (0.5 * speed * t * t) / rampTime : speed * (t - rampTime / 2),
    velocity: (t) => (t <= 0 ? 0 : t < rampTime ? (speed * t) / rampTime : speed),
    acceleration: (t) => (t >= 0 && t < rampTime ? speed / rampTime : 0),
  };
}

/** Sprocket pitch diameter D = p / sin(180°/N). */
export function pitchDiameter(pitch: number, teeth: number): number {
  return pitch / Math.sin(Math.PI / teeth);
}
