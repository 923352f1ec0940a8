/**
 * The command line's input error: {@link InputError} from the shared `errors/` part, which the
 * command line maps to exit code 2 with a clear message and no stack trace.
 *
 * @module
 */
export { InputError } from "../../errors/mod.ts";
