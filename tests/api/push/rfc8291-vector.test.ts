import { createECDH, createHmac, hkdfSync } from 'node:crypto';
import { decrypt, encrypt } from 'http_ece';
import { describe, expect, it } from 'vitest';

// RFC 8291 Appendix A, base64url as the appendix prints it. The values vouch for each other: the
// public keys derive from the private ones, and AES-GCM output cannot match by accident.
const appendix = {
  plaintext: 'V2hlbiBJIGdyb3cgdXAsIEkgd2FudCB0byBiZSBhIHdhdGVybWVsb24',
  applicationServerPrivateKey: 'yfWPiYE-n46HLnH0KqZOF1fJJU3MYrct3AELtAQ-oRw',
  applicationServerPublicKey:
    'BP4z9KsN6nGRTbVYI_c7VJSPQTBtkgcy27mlmlMoZIIgDll6e3vCYLocInmYWAmS6TlzAC8wEqKK6PBru3jl7A8',
  userAgentPrivateKey: 'q1dXpw3UpT5VOmu_cf_v6ih07Aems3njxI-JWgLcM94',
  userAgentPublicKey:
    'BCVxsr7N_eNgVRqvHtD0zTZsEc6-VV-JvLexhqUzORcxaOzi6-AYWXvTBHm4bjyPjs7Vd8pZGH6SRpkNtoIAiw4',
  salt: 'DGv6ra1nlYgDCS1FRnbzlw',
  authSecret: 'BTBZMqHH6r4Tts7J_aSIgg',
  sharedEcdhSecret: 'kyrL1jIIOHEzg3sM2ZWRHDRB62YACZhhSlknJ672kSs',
  ikm: 'S4lYMb_L0FxCeq0WhDx813KgSYqU26kOyzWUdsXYyrg',
  cek: 'oIhVW04MRdy2XN9CiKLxTg',
  nonce: '4h_95klXJ5E_qnoN',
  header:
    'DGv6ra1nlYgDCS1FRnbzlwAAEABBBP4z9KsN6nGRTbVYI_c7VJSPQTBtkgcy27mlmlMoZIIgDll6e3vCYLocInmYWAmS6TlzAC8wEqKK6PBru3jl7A8',
  ciphertext: '8pfeW0KbunFT06SuDKoJH9Ql87S1QUrdirN6GcG7sFz1y1sqLgVi1VhjVkHsUoEsbI_0LpXMuGvnzQ',
  body:
    'DGv6ra1nlYgDCS1FRnbzlwAAEABBBP4z9KsN6nGRTbVYI_c7VJSPQTBtkgcy27mlmlMoZIIgDll6e3vCYLocInmYWAmS6TlzAC8wEqKK6PBru3jl7A_' +
    'yl95bQpu6cVPTpK4Mqgkf1CXztLVBSt2Ks3oZwbuwXPXLWyouBWLVWGNWQexSgSxsj_Qulcy4a-fN',
} as const;

const bytes = (base64url: string) => Buffer.from(base64url, 'base64url');

function keyPair(privateKey: string) {
  const pair = createECDH('prime256v1');
  pair.setPrivateKey(bytes(privateKey));
  return pair;
}

describe('RFC 8291 Appendix A test vector', () => {
  it('has key pairs whose public halves are the ones the appendix prints', () => {
    expect(keyPair(appendix.applicationServerPrivateKey).getPublicKey('base64url')).toBe(
      appendix.applicationServerPublicKey,
    );
    expect(keyPair(appendix.userAgentPrivateKey).getPublicKey('base64url')).toBe(appendix.userAgentPublicKey);
  });

  it('derives the appendix ECDH secret, IKM, CEK and NONCE (RFC 8291 §3.3–3.4, RFC 8188 §2.2)', () => {
    const ecdhSecret = keyPair(appendix.applicationServerPrivateKey).computeSecret(
      bytes(appendix.userAgentPublicKey),
    );
    // RFC 8291 §3.4: key_info = "WebPush: info" || 0x00 || ua_public || as_public.
    const keyInfo = Buffer.concat([
      Buffer.from('WebPush: info\0'),
      bytes(appendix.userAgentPublicKey),
      bytes(appendix.applicationServerPublicKey),
    ]);
    const ikm = Buffer.from(hkdfSync('sha256', ecdhSecret, bytes(appendix.authSecret), keyInfo, 32));
    const salt = bytes(appendix.salt);
    const cek = Buffer.from(hkdfSync('sha256', ikm, salt, Buffer.from('Content-Encoding: aes128gcm\0'), 16));
    const nonce = Buffer.from(hkdfSync('sha256', ikm, salt, Buffer.from('Content-Encoding: nonce\0'), 12));

    expect(ecdhSecret.toString('base64url')).toBe(appendix.sharedEcdhSecret);
    expect(ikm.toString('base64url')).toBe(appendix.ikm);
    expect(cek.toString('base64url')).toBe(appendix.cek);
    expect(nonce.toString('base64url')).toBe(appendix.nonce);
    // The PRK printed in the appendix is HKDF-Extract(salt, IKM).
    expect(createHmac('sha256', salt).update(ikm).digest('base64url')).toBe(
      '09_eUZGrsvxChDCGRCdkLiDXrReGOEVeSCdCcPBSJSc',
    );
  });

  it('encrypts the appendix plaintext with http_ece to the appendix body, byte for byte', () => {
    const body = encrypt(bytes(appendix.plaintext), {
      version: 'aes128gcm',
      privateKey: keyPair(appendix.applicationServerPrivateKey),
      dh: appendix.userAgentPublicKey,
      authSecret: appendix.authSecret,
      salt: appendix.salt,
      rs: 4096,
    });

    expect(body.toString('base64url')).toBe(appendix.body);
    expect(body.equals(Buffer.concat([bytes(appendix.header), bytes(appendix.ciphertext)]))).toBe(true);
  });

  it('decrypts the appendix body with the user agent key and auth secret', () => {
    const plaintext = decrypt(bytes(appendix.body), {
      version: 'aes128gcm',
      privateKey: keyPair(appendix.userAgentPrivateKey),
      authSecret: appendix.authSecret,
    });

    expect(plaintext.toString('base64url')).toBe(appendix.plaintext);
    expect(plaintext.toString('utf8')).toBe('When I grow up, I want to be a watermelon');
  });

  it('refuses the body under a different auth secret', () => {
    expect(() =>
      decrypt(bytes(appendix.body), {
        version: 'aes128gcm',
        privateKey: keyPair(appendix.userAgentPrivateKey),
        authSecret: Buffer.alloc(16, 7),
      }),
    ).toThrow();
  });
});
