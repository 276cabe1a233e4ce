/**
 * Bad input on the real command line (fit,compare), under --json: exit 2, exactly one JSON document
 * with status 'error', the error code, and a message with 'Fix:'; JSON syntax errors name line and
 * column. The cases are listed in cli-error-cases.ts.
 */
import { errorSuite } from './cli-error-cases';

errorSuite(['fit','compare']);
