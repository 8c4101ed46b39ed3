// The request form's schema is shared with the page: lib/organisations/request.ts.
export { organisationRequestInput, type OrganisationRequestFormInput } from "@/lib/organisations/request";
