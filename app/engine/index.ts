/**
 * The roof engine: pure TypeScript, shared by the browser, a Web Worker and the server. This face
 * has every reader installed, mathjs' fall units included; `./core.ts` is the same without them.
 */
import "./fall-units";

export * from "./core";
