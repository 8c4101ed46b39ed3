// An event's details are one schema for the organiser's form and this handler: lib/setup/event.ts.
export { createEventInput, endsAfterStarts, eventFields, type CreateEventInput } from "@/lib/setup/event";
