/** The tool's name and version as printed on every exported figure and datasheet (package.json's version; a test keeps them equal). */
export const TOOL_NAME = 'Torquewise';
export const TOOL_VERSION = '0.1.0';
