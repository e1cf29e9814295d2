/* global module, process */
// autocannon's per-connection setup for `npm run load`'s sign-in round (its worker thread `require`s this file):
// connection k signs in as account k of LOAD_SIGN_IN_ACCOUNTS (JSON: [{ email, password }]), round robin. One
// account's sign-ins arriving together are limited on purpose (credential-limiter.ts: at most 20 attempts of one
// account in flight count as failures before their passwords are checked), so 50 connections on one account
// would measure 429s, not sign-in.
const accounts = JSON.parse(process.env.LOAD_SIGN_IN_ACCOUNTS ?? '[]');
let next = 0;

module.exports = function setupClient(client) {
  if (accounts.length === 0) return;
  client.setBody(JSON.stringify(accounts[next++ % accounts.length]));
};
