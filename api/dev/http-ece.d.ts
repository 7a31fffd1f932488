/**
 * The part of http_ece 1.2 (RFC 8188 encrypted content coding) that Brinewatch uses: the push
 * stand-in decrypts with it, and the RFC 8291 test vector encrypts with it. The package ships no
 * declarations; delete this file once it or @types/http_ece does (an ambient declaration would
 * shadow the real one).
 */
declare module 'http_ece' {
  import type { ECDH } from 'node:crypto';

  export interface EceParams {
    /** 'aes128gcm' (RFC 8188, what RFC 8291 requires) is the default. */
    version?: 'aes128gcm' | 'aesgcm';
    /** Record size; 4096 when omitted. Read from the header when decrypting aes128gcm. */
    rs?: number;
    /** 16 octets; random when omitted on encrypt. Strings are base64url. */
    salt?: string | Buffer;
    keyid?: string | Buffer;
    /** An explicit 16-octet content-encryption key instead of a key agreement. */
    key?: string | Buffer;
    /** Encrypt: the sender's ECDH key pair. Decrypt: the receiver's. */
    privateKey?: ECDH;
    /** Encrypt: the receiver's public key (uncompressed P-256 point). Strings are base64url. */
    dh?: string | Buffer;
    /** RFC 8291 §3.2 authentication secret. Strings are base64url. */
    authSecret?: string | Buffer;
    /** Octets of padding to add when encrypting. */
    pad?: number;
    keymap?: Record<string, Buffer>;
    keylabel?: string;
  }

  export function encrypt(buffer: Buffer, params: EceParams, keyLookup?: (keyid: Buffer) => Buffer): Buffer;
  export function decrypt(buffer: Buffer, params: EceParams, keyLookup?: (keyid: Buffer) => Buffer): Buffer;
}
