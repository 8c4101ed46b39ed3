import type { routing } from "./routing";
import type messages from "../../messages/en.json";

// Typed message keys: a key missing from en.json is a type error.
declare module "next-intl" {
  interface AppConfig {
    Locale: (typeof routing.locales)[number];
    Messages: typeof messages;
  }
}
