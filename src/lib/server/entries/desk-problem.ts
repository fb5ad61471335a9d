import { Refusal } from '../http/refusal';

/** A desk action that cannot be done, in a plain sentence. */
export class DeskProblem extends Refusal {}
