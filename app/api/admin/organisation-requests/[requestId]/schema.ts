export { organisationDecisionInput } from "@/lib/organisations/request";
