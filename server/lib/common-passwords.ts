/**
 * Common passwords that are refused when someone sets a password (OWASP ASVS 5.0 V6.2.4:
 * check new passwords against a list of at least the top 3,000 common passwords; we ship a
 * smaller list and document the gap in the README's Decisions).
 *
 * Source: written from memory of the widely circulated "most common passwords" top lists
 * (leaked-password frequency lists such as the RockYou-derived top 1,000 and yearly
 * "worst passwords" rankings) [memory]. It is not a copy of any one list. Each base word also
 * blocks its usual suffixed forms (word1, word123, word!, word2024 …), generated below.
 * Comparison ignores case and surrounding spaces.
 */

// Whole passwords as people type them (digits, keyboard walks, phrases).
const literal = `
123456 123456789 12345678 12345 1234567 1234567890 123123 000000 111111 1234 123321 654321
666666 121212 112233 777777 987654321 11111111 88888888 12341234 00000000 11223344 1q2w3e4r
1q2w3e4r5t 1qaz2wsx qwerty qwerty123 qwerty1 qwertyuiop qwerty12 qwer1234 asdfgh asdfghjkl
asdf1234 zxcvbnm zxcvbn 1qazxsw2 zaq12wsx zaq1zaq1 qazwsx qazwsxedc 123qwe 123qweasd 123abc
abc123 abcd1234 abcdef abcdefg abcdefgh a1b2c3d4 a1b2c3 aa123456 aaaaaa aaaaaaaa password
password1 password123 password12 passw0rd p@ssw0rd p@ssword pa55word pass1234 pass123
password! password01 passpass letmein letmein1 letmein123 welcome welcome1 welcome123 iloveyou
iloveyou1 iloveyou2 iloveu loveyou trustno1 trustnoone 1234qwer qwe123 qweasd qweasdzxc
123456a 123456q a123456 a12345678 q1w2e3r4 q1w2e3r4t5 q1w2e3 1a2b3c4d 147258369 159753
159357 741852963 963852741 789456123 456789 123654 147258 258369 192837465 987654 1111111
11111 1111 2222 22222222 33333333 44444444 55555555 66666666 77777777 99999999 12121212
13131313 69696969 123123123 112211 12344321 1234554321 123454321 qwertyu qwertz qwertzuiop
azerty azerty123 azertyuiop wasd wasdwasd asdasd asdasdasd zxczxc zxcvbnm123 mnbvcxz
poiuytrewq lkjhgfdsa 0987654321 9876543210 00000 012345 0123456789 1029384756 1357924680
2468013579 11112222 12qwaszx 1qaz1qaz 2wsx3edc !qaz2wsx !qaz@wsx 1q2w3e 1q2w3e4r5t6y
q1w2e3r4t5y6 qwerty12345 qwerty1234 qwertyui asdfghjk zxcvbnm1 letmeinnow opensesame
iamthebest imthebest ilovemymom ilovemom ilovemum ilovemydog ilovemycat ihateyou iloveme
lovelove loveme loveme1 mylove mypassword mypass mysecret secret secret1 secret123 topsecret
changeme changeme1 changeit default default1 temp123 temppass temp1234 guest guest123 admin
admin1 admin123 admin1234 administrator root root123 toor user user123 user1234 test test1
test123 test1234 testing testing123 tester demo demo123 sample login login123 access
access14 master master123 masterkey superuser supervisor manager system sysadmin webadmin
qwerty!@# !@#$%^&* !@#$%^ 1qaz!qaz p4ssw0rd passw0rd1 pa$$w0rd pa$$word passwort motdepasse
contrasena contraseña senha parola salasana wachtwoord haslo lösenord adgangskode
thisismypassword thisisapassword nopassword noentry enterpassword yourpassword whatever
whatever1 nothing anything something somethingelse idontknow dontknow forgot forgotten
forgetit youknow iknow blahblah blah123 asdf asdfasdf jkljkl hjkl fghj cvbn yxcvbnm
helloworld hello123 hello1 hellohello hithere hiya goodbye goodluck goodday goodgirl goodboy
happy123 happyday happy1 smile123 sunshine1 rainbow1 starwars1 football1 baseball1
basketball1 soccer1 hockey1 tennis1 golf123 superman1 batman1 spiderman1 pokemon1 princess1
dragon1 monkey1 shadow1 master1 michael1 jordan23 jordan1 charlie1 jennifer1 nicole1 daniel1
jessica1 ashley1 michelle1 matthew1 andrew1 joshua1 anthony1 thomas1 robert1 william1
`;

// Words people build passwords from; each also blocks its common suffixed forms.
const baseWords = `
password passwort passe pass secret letmein welcome hello iloveyou loveme lovely love
monkey dragon shadow master sunshine princess football baseball basketball soccer hockey
tennis golfer killer superman batman spiderman starwars pokemon naruto michael jordan
charlie jennifer nicole daniel jessica ashley michelle matthew andrew joshua anthony thomas
robert william hunter ranger buster tigger harley pepper ginger maggie bailey cookie
chocolate cheese butter orange banana apple cherry summer winter autumn spring freedom
flower flowers forever friends friend family mother father sister brother angel angels
jesus christ heaven blessed faith trinity matrix hacker computer internet google facebook
yahoo hotmail gmail iphone samsung nokia windows microsoft apple123 london paris berlin
madrid newyork chicago boston dallas texas florida california canada mexico england
scotland ireland london1 liverpool chelsea arsenal manchester barcelona juventus
realmadrid united soccer12 purple yellow silver golden diamond crystal pearl ruby
sapphire emerald whisky vodka tequila beer cocacola pepsi coffee tea pizza burger
chicken turkey bacon pickle pumpkin peanut monster zombie vampire wizard merlin gandalf
frodo hobbit legolas pirate ninja samurai warrior soldier hunter1 sniper shooter gamer
player minecraft fortnite roblox zelda mario sonic tetris arcade guitar piano music
rockstar rocknroll metallica nirvana beatles elvis madonna eminem tupac snoopy garfield
scooby pluto mickey minnie donald goofy tweety bugsbunny simpsons homer bart
lisa marge southpark cartman kenny family1 money money1 dollars cash rich million
billion lucky lucky7 lucky13 winner champion victory success power strong tiger lion
eagle falcon hawk phoenix dolphin shark whale panda koala bear wolf fox rabbit bunny
kitty kitten puppy doggie horse pony unicorn butterfly ladybug bumblebee honey sugar
sweety sweetie sweetheart darling baby babygirl babyboy cutie beauty pretty handsome
sexy hottie babe lover kisses hugs hugsandkisses forever1 always together myself
jasmine jasper oliver olivia sophia emma isabella mia ava emily abigail madison chloe
ella grace lily hannah sarah samantha amanda elizabeth rebecca rachel lauren victoria
natalie stephanie heather melissa amber crystal1 tiffany brittany courtney chelsea1
alexander alexandra benjamin christopher christian jonathan nicholas patrick richard
charles george edward henry james john david mark paul peter steven stephen kevin brian
jason justin ryan eric adam scott aaron tyler brandon austin dylan ethan logan lucas
mason noah liam jacob jackson aiden caleb nathan isaac gabriel samuel elijah owen
freddy maxwell max buddy rocky lucky1 duke bear1 toby sammy oscar milo teddy zeus
snowball smokey misty shadow12 midnight moonlight starlight stardust galaxy planet
universe cosmos rocket spaceman astronaut pilot captain sailor anchor ocean beach
island tropical paradise sunset sunrise rainbow thunder lightning storm tornado hurricane
blizzard snowflake icecream cupcake cheesecake pancake waffle donut muffin cookie1
biscuit brownie candy lollipop marshmallow popcorn nutella caramel vanilla strawberry
blueberry raspberry watermelon pineapple mango coconut lemon lime peach plum grape
qwerty asdfgh zxcvbn qazwsx abc abcd test admin user guest login access
`;

const suffixes = [
  "",
  "1",
  "12",
  "123",
  "1234",
  "12345",
  "!",
  "1!",
  "123!",
  "01",
  "007",
  "69",
  "2020",
  "2021",
  "2022",
  "2023",
  "2024",
  "2025",
  "2026",
];

const words = baseWords.split(/\s+/).filter(Boolean);

/** The refused passwords, lower-cased: ≈ 320 literal entries and ≈ 450 base words × 19 suffixes (≈ 8,800 in all). */
export const commonPasswords: ReadonlySet<string> = new Set([
  ...literal.split(/\s+/).filter(Boolean),
  ...words.flatMap((word) => suffixes.map((suffix) => word + suffix)),
]);

/** True when the password, ignoring case and surrounding spaces, is on the list. */
export function isCommonPassword(password: string): boolean {
  return commonPasswords.has(password.trim().toLowerCase());
}
