/** The header our auth route sets from the connection's address; better-auth reads only this one. */
export const CLIENT_IP_HEADER = 'x-lossline-client-ip';
