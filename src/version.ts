/** The tool version, written into every result file. */
export const VERSION = '0.1.0';
