// The one error the calibration throws: a photo or card that cannot give a trustworthy correction.

/** Thrown when a card reading cannot be calibrated; `code` says why, `message` says what to do. */
export class CalibrationError extends Error {
  readonly code: CalibrationErrorCode;
  /** 0-based indices of the patches at fault, when the fault lies with particular patches. */
  readonly patches: number[];

  constructor(code: CalibrationErrorCode, message: string, patches: number[] = []) {
    super(message);
    this.name = "CalibrationError";
    this.code = code;
    this.patches = patches;
  }
}

export type CalibrationErrorCode =
  | "too-few"
  | "clipped"
  | "too-dark"
  | "no-neutral"
  | "degenerate"
  | "out-of-order";
