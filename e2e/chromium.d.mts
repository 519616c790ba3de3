export declare const CHROMIUM_EXECUTABLE: string;
export declare const CHROMIUM_ARGS: string[];
