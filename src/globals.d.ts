declare const __TW_BUILD__: string;
