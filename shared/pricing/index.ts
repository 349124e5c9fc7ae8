export * from "./price-quote";
