/** How many 2xx answers the API tests checked against their declared schema so far (tests/support/api-setup.ts). */
export const answersChecked = { count: 0 };
