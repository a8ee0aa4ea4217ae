/** Input the method cannot work with. `field` names the SpecimenInput key at fault. */
export class EstimateInputError extends Error {
  readonly code: string;
  readonly field: string;
  constructor(code: string, field: string, message: string) {
    super(message);
    this.name = "EstimateInputError";
    this.code = code;
    this.field = field;
  }
}
