export { addOrganiserInput } from "@/lib/organisations/request";
